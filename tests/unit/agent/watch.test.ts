import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "@/lib/agent/agent";
import type { Profile } from "@/lib/reduction/profile";
import { deadband } from "../bundles/fixtures";
import { agentHarness, inputCsv, k1 } from "./agent-harness";
import { bundleText } from "./fixtures";

// --watch against a registry on 127.0.0.1 over real HTTP, with real timers (poll 1 s).
const h = agentHarness();
const stats: Profile = { name: "Statistics", kinds: ["analog"], outputs: [{ name: "avg", steps: [{ method: "aggregate", fn: "mean", window: 60 }] }] };

async function until(f: () => boolean) {
  for (let i = 0; i < 200 && !f(); i++) await new Promise((r) => setTimeout(r, 25));
  expect(f()).toBe(true);
}
const readJson = (...parts: string[]) => JSON.parse(fs.readFileSync(path.join(h.dir, ...parts), "utf8"));

describe("--watch", () => {
  it("follows the input, switches to a new release while running, and writes the rest on stop", async () => {
    h.registry.state.served = { text: bundleText({ release: 14, poll: 1 }), key: k1 };
    fs.writeFileSync(path.join(h.dir, "in.csv"), inputCsv(0, 100));
    const stop = new AbortController();
    const done = h.run({ watch: true, tailMs: 20, signal: stop.signal, sleep: undefined });
    const out = path.join(h.dir, "out.csv");
    await until(() => fs.existsSync(out) && h.outputLines().some((l) => l.includes("PAST1/PT-201/PV,db,")));
    fs.appendFileSync(path.join(h.dir, "in.csv"), inputCsv(100, 200, false));
    await until(() => h.outputLines().some((l) => l.includes("2026-12-01T10:02:00.000Z")));

    // Release 15 aggregates; the old bundle has no windows, so the next newer sample switches.
    h.registry.state.served = { text: bundleText({ release: 15, poll: 1, profiles: new Map([[13, stats], [21, deadband()]]) }), key: k1 };
    await until(() => h.logs.some((l) => l.startsWith("release 15 of fw-gw-01 applied; its runners take over at 2026-12-01T10:03:19.000Z")));
    fs.appendFileSync(path.join(h.dir, "in.csv"), inputCsv(200, 300, false));
    await until(() => h.outputLines().some((l) => l.startsWith("PAST1/TT-101/PV,avg,2026-12-01T10:03:00.000Z")));
    await until(() => h.registry.state.checkIns.some((c) => c.release === 15));
    stop.abort();
    expect(await done).toBe(EXIT.ok);
    expect(h.stored().release).toBe(15);

    const lines = h.outputLines();
    expect(lines[0]).toBe("tag,output,time,value,quality");
    const shape = lines.filter((l) => l.startsWith("PAST1/TT-101/PV,shape,"));
    const avg = lines.filter((l) => l.startsWith("PAST1/TT-101/PV,avg,"));
    // The old runner was flushed at the switch: its last sample is the one before the boundary.
    expect(shape.at(-1)).toMatch(/^PAST1\/TT-101\/PV,shape,2026-12-01T10:03:19\.000Z,/);
    // The new runner started at the boundary: its first window holds only 10:03:20–10:03:59, the last is written on stop.
    expect(avg.map((l) => l.split(",")[2])).toEqual(["2026-12-01T10:03:00.000Z", "2026-12-01T10:04:00.000Z"]);
    const pending = h.outbox().map((f) => readJson("state", "outbox", f).pointsIn as number);
    expect(h.registry.state.checkIns.reduce((n, c) => n + c.pointsIn, 0) + pending.reduce((a, b) => a + b, 0)).toBe(2 * 300 + 30 + 5);
  });

  it("keeps reducing with the last good bundle while the registry is down, and logs the freshness alarm", async () => {
    expect(await h.run()).toBe(EXIT.ok);
    await h.registry.close();
    fs.writeFileSync(path.join(h.dir, "in.csv"), inputCsv(0, 50));
    const stop = new AbortController();
    const later = () => Date.now() + 400_000; // past the default 3 × 60 s
    const done = h.run({ watch: true, tailMs: 20, signal: stop.signal, now: later });
    await until(() => h.logs.some((l) => l.startsWith("ALARM: no valid freshness statement for")));
    await until(() => fs.existsSync(path.join(h.dir, "out.csv")) && h.outputLines().some((l) => l.startsWith("PAST1/TT-101/PV,shape,")));
    stop.abort();
    expect(await done).toBe(EXIT.ok);
    expect(h.logs.some((l) => l.startsWith("registry unreachable:"))).toBe(true);
    expect(h.outbox().length).toBeGreaterThan(0);
  });
});
