import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "@/lib/agent/agent";
import { agentHarness, inputCsv, k1 } from "./agent-harness";
import { bundleText } from "./fixtures";

// --watch against a registry on 127.0.0.1 over real HTTP, with real timers (poll 1 s).
const h = agentHarness();

describe("--watch", () => {
  it("follows the input, switches to a new release while running, and writes the rest on stop", async () => {
    h.registry.state.served = { text: bundleText({ release: 14, poll: 1 }), key: k1 };
    fs.writeFileSync(path.join(h.dir, "in.csv"), inputCsv(0, 100));
    const stop = new AbortController();
    const done = h.run({ watch: true, tailMs: 20, signal: stop.signal, sleep: undefined });
    const until = async (f: () => boolean) => {
      for (let i = 0; i < 200 && !f(); i++) await new Promise((r) => setTimeout(r, 25));
      expect(f()).toBe(true);
    };
    const out = path.join(h.dir, "out.csv");
    await until(() => fs.existsSync(out) && h.outputLines().some((l) => l.includes("PAST1/PT-201/PV,db,")));
    fs.appendFileSync(path.join(h.dir, "in.csv"), inputCsv(100, 200, false));
    await until(() => h.outputLines().some((l) => l.includes("2026-12-01T10:02:00.000Z")));
    h.registry.state.served = { text: bundleText({ release: 15, poll: 1 }), key: k1 };
    await until(() => h.logs.some((l) => l.startsWith("release 15 of fw-gw-01 applied")));
    await until(() => h.registry.state.checkIns.some((c) => c.release === 15));
    stop.abort();
    expect(await done).toBe(EXIT.ok);
    expect(h.stored().release).toBe(15);
    const lines = h.outputLines();
    expect(lines[0]).toBe("tag,output,time,value,quality");
    // The last samples of the swinging door are written by the finish on stop.
    expect(lines.some((l) => l.startsWith("PAST1/TT-101/PV,shape,2026-12-01T10:03:19.000Z"))).toBe(true);
    expect(h.registry.state.checkIns.reduce((n, c) => n + c.pointsIn, 0) + JSON.parse(fs.readFileSync(path.join(h.dir, "state", "outbox", h.outbox()[0]), "utf8")).pointsIn).toBe(2 * 200 + 20 + 4);
  });
});
