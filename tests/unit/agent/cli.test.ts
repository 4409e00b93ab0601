import { execFile } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { describe, expect, it } from "vitest";
import { parseAgentArgs } from "@/lib/agent/cli";
import { generateSigningKey, publicKeys } from "@/lib/bundles/signing";
import { bundleText, startRegistry } from "./fixtures";

const required = ["--url", "http://127.0.0.1:3000", "--token-file", "t", "--state-dir", "s", "--input", "i.csv", "--output", "o.csv"];

describe("parseAgentArgs", () => {
  it("reads the flags, with --skew 60 by default and --max-silence left to the bundle's poll", () => {
    expect(parseAgentArgs(required)).toEqual({
      url: "http://127.0.0.1:3000",
      tokenFile: "t",
      stateDir: "s",
      input: "i.csv",
      output: "o.csv",
      trust: undefined,
      watch: false,
      maxSilenceS: undefined,
      skewS: 60,
    });
    expect(parseAgentArgs([...required, "--watch", "--trust", "k.json", "--max-silence", "600", "--skew", "0"])).toMatchObject({ watch: true, trust: "k.json", maxSilenceS: 600, skewS: 0 });
  });

  it("names what is missing or wrong", () => {
    expect(() => parseAgentArgs(required.slice(2))).toThrow("missing --url");
    expect(() => parseAgentArgs([...required, "--max-silence", "0"])).toThrow(/--max-silence needs a positive number/);
    expect(() => parseAgentArgs([...required, "--skew=-1"])).toThrow(/--skew needs a non-negative number/);
    expect(() => parseAgentArgs([...required, "--token", "x"])).toThrow(/Unknown option '--token'/);
    expect(() => parseAgentArgs(["--url", "ftp://x", ...required.slice(2)])).toThrow(/must be http\(s\)/);
  });
});

describe("scripts/agent.ts", () => {
  it("runs as a child process: reduces the input, prints no token, exits 0, and exits 1 with the usage on bad flags", { timeout: 60_000 }, async () => {
    const k1 = generateSigningKey("k1");
    const registry = await startRegistry({ text: bundleText(), key: k1 });
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "agent-cli-"));
    try {
      fs.writeFileSync(path.join(dir, "token"), "gw-token\n");
      fs.writeFileSync(path.join(dir, "keys.json"), JSON.stringify({ keys: publicKeys([k1]) }));
      let csv = "tag,time,value\n";
      for (let i = 0; i < 300; i++) csv += `PAST1/TT-101/PV,${Date.UTC(2026, 11, 1) + i * 1000},${70 + Math.sin(i / 20)}\n`;
      fs.writeFileSync(path.join(dir, "in.csv"), csv);
      const args = ["--import", "tsx", "scripts/agent.ts", "--url", registry.url, "--token-file", path.join(dir, "token"), "--state-dir", path.join(dir, "state")];
      const io = ["--input", path.join(dir, "in.csv"), "--output", path.join(dir, "out.csv"), "--trust", path.join(dir, "keys.json")];
      const { stderr } = await promisify(execFile)(process.execPath, [...args, ...io], { cwd: process.cwd() });
      expect(stderr).not.toContain("gw-token");
      const out = fs.readFileSync(path.join(dir, "out.csv"), "utf8").trimEnd().split("\n");
      expect(out[0]).toBe("tag,output,time,value,quality");
      expect(out.length - 1).toBeLessThan(300);
      expect(registry.state.checkIns).toHaveLength(1);
      const bad = await promisify(execFile)(process.execPath, [...args, "--input"], { cwd: process.cwd() }).catch((e) => e);
      expect(bad.code).toBe(1);
      expect(bad.stderr).toContain("usage: npm run agent");
    } finally {
      await registry.close();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
