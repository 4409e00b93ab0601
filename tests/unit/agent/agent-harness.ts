import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterEach, beforeEach } from "vitest";
import { type AgentOptions, runAgent } from "@/lib/agent/agent";
import { generateSigningKey, publicKeys } from "@/lib/bundles/signing";
import { bundleText, startRegistry } from "./fixtures";

export const k1 = generateSigningKey("k1");
export const T0 = Date.UTC(2026, 11, 1, 10, 0, 0);

/** 600 s of three known tags and one the bundle does not list. */
export function inputCsv(fromS = 0, toS = 600, header = true): string {
  let s = header ? "tag,time,value,quality\n" : "";
  for (let i = fromS; i < toS; i++) {
    const t = new Date(T0 + i * 1000).toISOString();
    s += `PAST1/TT-101/PV,${t},${(72 + Math.sin(i / 30)).toFixed(3)},0\n`;
    s += `PAST1/PT-201/PV,${T0 + i * 1000},${(300 + 20 * Math.sin(i / 60)).toFixed(2)},0\n`;
    if (i % 10 === 0) s += `PAST1/FT-900/PV,${t},${(i % 40) / 4},0\n`;
    if (i % 60 === 0) s += `X9/UNKNOWN/PV,${t},1,0\n`;
  }
  return s;
}

/**
 * A temporary directory with token, trust file and input, and a registry on 127.0.0.1
 * speaking the contract of DESIGN.md "Gateway API" over real HTTP, fresh for each test.
 * Waits are recorded, not slept (the schedule itself is tested in backoff.test.ts).
 */
export function agentHarness() {
  const h = {
    dir: "",
    registry: undefined as unknown as Awaited<ReturnType<typeof startRegistry>>,
    logs: [] as string[],
    waits: [] as number[],
    options(over: Partial<AgentOptions> = {}): AgentOptions {
      return {
        url: h.registry.url,
        tokenFile: path.join(h.dir, "token"),
        stateDir: path.join(h.dir, "state"),
        input: path.join(h.dir, "in.csv"),
        output: path.join(h.dir, "out.csv"),
        trust: path.join(h.dir, "trust.json"),
        watch: false,
        log: (line) => h.logs.push(line),
        retry: { baseMs: 100, capMs: 1000, maxAttempts: 3, maxWaitMs: 10_000 },
        sleep: async (ms) => {
          h.waits.push(ms);
        },
        ...over,
      };
    },
    run: (over: Partial<AgentOptions> = {}) => runAgent(h.options(over)),
    outputLines: () => fs.readFileSync(path.join(h.dir, "out.csv"), "utf8").trimEnd().split("\n"),
    stored: () => JSON.parse(fs.readFileSync(path.join(h.dir, "state", "bundle.json"), "utf8")) as { release: number; digest: string },
    outbox: () => fs.readdirSync(path.join(h.dir, "state", "outbox")),
  };
  beforeEach(async () => {
    h.dir = fs.mkdtempSync(path.join(os.tmpdir(), "agent-"));
    fs.writeFileSync(path.join(h.dir, "token"), "gw-token\n");
    fs.writeFileSync(path.join(h.dir, "trust.json"), JSON.stringify({ keys: publicKeys([k1]) }));
    fs.writeFileSync(path.join(h.dir, "in.csv"), inputCsv());
    h.registry = await startRegistry({ text: bundleText({ release: 14 }), key: k1 });
    h.logs = [];
    h.waits = [];
  });
  afterEach(async () => {
    await h.registry.close();
    fs.rmSync(h.dir, { recursive: true, force: true });
  });
  return h;
}
