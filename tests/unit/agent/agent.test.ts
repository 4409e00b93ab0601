import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { EXIT } from "@/lib/agent/agent";
import { digestHex } from "@/lib/bundles/digest";
import { generateSigningKey, publicKeys, rotateKey, signBytes } from "@/lib/bundles/signing";
import type { Profile } from "@/lib/reduction/profile";
import { deadband } from "../bundles/fixtures";
import { agentHarness, inputCsv, k1 } from "./agent-harness";
import { bundleText, startRegistry } from "./fixtures";

// The agent end to end, one-shot, against a registry on 127.0.0.1 over real HTTP, with
// real keys and real files in a temporary state dir.
const lttb: Profile = { name: "Plot", kinds: ["analog"], outputs: [{ name: "plot", steps: [{ method: "lttb", points: 50 }] }] };
const h = agentHarness();

describe("one-shot run", () => {
  it("pins the trust file, pulls, reduces the input and checks in with its counters and unknown tags", async () => {
    expect(await h.run()).toBe(EXIT.ok);
    const lines = h.outputLines();
    const inputRows = inputCsv().trimEnd().split("\n").length - 1;
    expect(lines[0]).toBe("tag,output,time,value,quality");
    expect(lines.length - 1).toBeLessThan(inputRows / 2);
    expect(lines.some((l) => l.startsWith("PAST1/TT-101/PV,shape,2026-12-01T10:00:00.000Z,"))).toBe(true);
    expect(lines.filter((l) => l.startsWith("PAST1/FT-900/PV,,"))).toHaveLength(60); // unassigned: passed through
    expect(lines.filter((l) => l.startsWith("X9/UNKNOWN/PV,,"))).toHaveLength(10); // unknown: follows unassigned
    expect(JSON.parse(fs.readFileSync(path.join(h.dir, "state", "keys.json"), "utf8")).keys[0].id).toBe("k1");
    expect(h.stored().release).toBe(14);
    const [report] = h.registry.state.checkIns;
    expect(report).toMatchObject({ status: "running", release: 14, digest: digestHex(bundleText({ release: 14 })), pointsIn: inputRows, pointsOut: lines.length - 1, unknownTags: ["X9/UNKNOWN/PV"] });
    expect(h.outbox()).toEqual([]);
    expect(fs.readdirSync(h.dir).filter((n) => n.endsWith(".tmp"))).toEqual([]);
  });

  it("asks with If-None-Match next time, takes the 304 as fresh, and counts from the previous report's end", async () => {
    await h.run();
    expect(await h.run()).toBe(EXIT.ok);
    const second = h.registry.state.requests.filter((r) => r.path === "bundle")[1];
    expect(second.headers["if-none-match"]).toContain(h.stored().digest);
    const [a, b] = h.registry.state.checkIns;
    expect(b.from).toBe(a.to);
    expect(b).toMatchObject({ status: "running", release: 14 });
  });

  it("applies a higher release, and refuses a lower one afterwards while still reducing with the last good bundle", async () => {
    await h.run();
    h.registry.state.served = { text: bundleText({ release: 15 }), key: k1 };
    expect(await h.run()).toBe(EXIT.ok);
    expect(h.stored().release).toBe(15);
    h.registry.state.served = { text: bundleText({ release: 13 }), key: k1 };
    expect(await h.run()).toBe(EXIT.refused);
    expect(h.stored().release).toBe(15);
    expect(h.outputLines().length).toBeGreaterThan(1);
    expect(h.registry.state.checkIns.at(-1)).toMatchObject({ status: "failed", release: 13 });
    expect(h.registry.state.checkIns.at(-1)!.message).toMatch(/lower than release 15/);
    expect(h.logs.some((l) => l.startsWith("ALARM: refused the bundle"))).toBe(true);
  });

  it("keeps the last good bundle when the new one cannot run, and checks in failed with the reason", async () => {
    await h.run();
    h.registry.state.served = { text: bundleText({ release: 16, profiles: new Map([[13, lttb], [21, deadband()]]) }), key: k1 };
    expect(await h.run()).toBe(EXIT.refused);
    expect(h.stored().release).toBe(14);
    expect(h.registry.state.checkIns.at(-1)).toMatchObject({ status: "failed", release: 16 });
    expect(h.registry.state.checkIns.at(-1)!.message).toMatch(/release 16 cannot run here: .*batch-only/);
    expect(h.outputLines().some((l) => l.includes(",shape,"))).toBe(true); // reduced with release 14
  });

  it("refuses a bundle for another gateway than it ran, and a tampered body", async () => {
    await h.run();
    h.registry.state.served = { text: bundleText({ release: 15, gateway: "fw-gw-02" }), key: k1 };
    expect(await h.run()).toBe(EXIT.refused);
    expect(h.logs.some((l) => l.includes("for gateway fw-gw-02; this agent runs fw-gw-01"))).toBe(true);
    const good = bundleText({ release: 15 });
    h.registry.state.served = { text: good, key: k1, signature: signBytes(k1, bundleText({ release: 17 })) };
    expect(await h.run()).toBe(EXIT.refused);
    expect(h.logs.some((l) => l.includes("Ed25519 signature by key \"k1\" does not verify"))).toBe(true);
    expect(h.stored().release).toBe(14);
  });

  it("buffers reports while the registry is unreachable, keeps reducing, and re-sends them under the same id", async () => {
    await h.run();
    const url = h.registry.url;
    await h.registry.close();
    fs.writeFileSync(path.join(h.dir, "in.csv"), inputCsv(600, 900));
    expect(await h.run()).toBe(EXIT.ok);
    expect(h.outputLines().some((l) => l.includes("2026-12-01T10:10:00.000Z"))).toBe(true);
    expect(h.waits).toHaveLength(2); // maxAttempts 3: two backoff h.waits, each within its full-jitter bound
    expect(h.waits[0]).toBeLessThan(100);
    expect(h.waits[1]).toBeLessThan(200);
    const kept = h.outbox();
    expect(kept).toHaveLength(1);
    const buffered = JSON.parse(fs.readFileSync(path.join(h.dir, "state", "outbox", kept[0]), "utf8"));
    expect(buffered.pointsIn).toBeGreaterThan(0);

    h.registry = await startRegistry({ text: bundleText({ release: 14 }), key: k1 });
    expect(await h.run({ url: h.registry.url })).toBe(EXIT.ok);
    expect(url).not.toBe(h.registry.url);
    expect(h.registry.state.checkIns.map((c) => c.report)[0]).toBe(buffered.report);
    expect(h.registry.state.checkIns).toHaveLength(2);
    expect(h.outbox()).toEqual([]);
  });

  it("honours Retry-After on 503, and never retries 401", async () => {
    h.registry.state.queue.set("bundle", [{ status: 503, headers: { "retry-after": "2" } }]);
    expect(await h.run()).toBe(EXIT.ok);
    expect(h.waits).toEqual([2000]);
    fs.writeFileSync(path.join(h.dir, "token"), "revoked\n");
    const before = h.registry.state.requests.length;
    expect(await h.run()).toBe(EXIT.fatal);
    expect(h.registry.state.requests.slice(before).filter((r) => r.path === "bundle")).toHaveLength(1);
    expect(h.logs.some((l) => l.includes("does not accept the token (401 invalid_token)"))).toBe(true);
  });

  it("exits non-zero with a clear message on 404 and when there is nothing to reduce with", async () => {
    h.registry.state.queue.set("bundle", [{ status: 404, headers: { "content-type": "application/json" } }]);
    expect(await h.run()).toBe(EXIT.fatal);
    expect(h.logs).toContain("the registry has no release for this gateway yet (404)");
    expect(h.logs).toContain("no bundle to reduce with: none pulled and none stored");
    expect(fs.existsSync(path.join(h.dir, "out.csv"))).toBe(false);
  });

  it("alarms when no valid freshness statement has been seen for --max-silence, allowing --skew", async () => {
    await h.run();
    // 10 minutes on: the registry's statements (3 min lifetime, real clock) have expired for this agent.
    const later = () => Date.now() + 600_000;
    expect(await h.run({ now: later, maxSilenceS: 300 })).toBe(EXIT.silence);
    expect(h.logs.some((l) => l.startsWith("ALARM: no valid freshness statement for"))).toBe(true);
    expect(h.logs.some((l) => l.includes("freshness statement expired"))).toBe(true);
    // With enough skew allowed the same statements are valid again.
    h.logs = [];
    expect(await h.run({ now: later, maxSilenceS: 300, skewS: 900 })).toBe(EXIT.ok);
    expect(h.logs.filter((l) => l.startsWith("ALARM"))).toEqual([]);
  });

  it("pins a rotated key the pinned key signed, and refuses one nobody it trusts signed", async () => {
    await h.run();
    const k2 = rotateKey(k1, "k2");
    h.registry.state.served = { text: bundleText({ release: 15, keyId: "k2" }), key: k2 };
    h.registry.state.keys = () => publicKeys([k1, k2]);
    expect(await h.run()).toBe(EXIT.ok);
    expect(h.stored().release).toBe(15);
    expect(JSON.parse(fs.readFileSync(path.join(h.dir, "state", "keys.json"), "utf8")).keys.map((k: { id: string }) => k.id)).toEqual(["k1", "k2"]);
    const k3 = generateSigningKey("k3");
    h.registry.state.served = { text: bundleText({ release: 16, keyId: "k3" }), key: k3 };
    h.registry.state.keys = () => publicKeys([k1, k2, k3]);
    expect(await h.run()).toBe(EXIT.refused);
    expect(h.logs).toContain('signing keys: not pinning "k3": not signed by a pinned key');
    expect(h.stored().release).toBe(15);
  });

  it("takes gzip answers (the ETag with its -gzip suffix) and checks the uncompressed bytes", async () => {
    await h.registry.close();
    h.registry = await startRegistry({ text: bundleText({ release: 14 }), key: k1 }, { gzip: true });
    expect(await h.run()).toBe(EXIT.ok);
    expect(h.registry.state.requests[0].headers["accept-encoding"]).toContain("gzip");
    expect(h.stored().release).toBe(14);
  });
});

