import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { makeReport } from "@/lib/agent/report";
import { StateDir, type StoredBundle, writeFileAtomic } from "@/lib/agent/state";

// Check-in shape: DESIGN.md "Gateway API" (PUT /api/gateway/v1/check-in).
const UUID_V4 = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;
const inForce: StoredBundle = { release: 14, gateway: "fw-gw-01", digest: "a".repeat(64), keyId: "k1", signature: "s", text: "", appliedAt: "2026-12-01T09:00:00.000Z" };
const counters = { pointsIn: 10, pointsOut: 3, unknownTags: [] as string[] };
const FROM = "2026-12-01T10:00:00.000Z";
const TO = "2026-12-01T10:01:00.000Z";

describe("makeReport", () => {
  it("reports the bundle in force as running with its counters and a fresh UUID v4", () => {
    const a = makeReport({ kind: "unchanged", fresh: true }, inForce, { ...counters, unknownTags: ["X/1"] }, FROM, TO)!;
    expect(a).toEqual({ report: a.report, release: 14, digest: inForce.digest, status: "running", appliedAt: inForce.appliedAt, pointsIn: 10, pointsOut: 3, from: FROM, to: TO, unknownTags: ["X/1"] });
    expect(a.report).toMatch(UUID_V4);
    expect(makeReport(null, inForce, counters, FROM, TO)!.report).not.toBe(a.report);
  });

  it("reports a bundle that could not run, or was refused, as failed under its own release and digest", () => {
    const failed = makeReport({ kind: "failed", message: "release 16 cannot run here", release: 16, digest: "b".repeat(64), fresh: true }, inForce, counters, FROM, TO)!;
    expect(failed).toMatchObject({ status: "failed", release: 16, digest: "b".repeat(64), appliedAt: TO, message: "release 16 cannot run here" });
    const refused = makeReport({ kind: "refused", message: "x".repeat(5000), release: 13, digest: "c".repeat(64), fresh: false }, inForce, counters, FROM, TO)!;
    expect(refused).toMatchObject({ status: "failed", release: 13 });
    expect(refused.message).toHaveLength(2000);
    // Without a usable release number the refusal is said beside the running bundle.
    expect(makeReport({ kind: "refused", message: "odd 304", release: null, digest: null, fresh: false }, inForce, counters, FROM, TO)).toMatchObject({ status: "running", release: 14, message: "odd 304" });
    expect(makeReport({ kind: "refused", message: "r0", release: 0, digest: "c".repeat(64), fresh: false }, inForce, counters, FROM, TO)).toMatchObject({ status: "running" });
  });

  it("makes nothing without a bundle to name, never a span that ends before it starts, and leaves out overlong tag names", () => {
    expect(makeReport({ kind: "unreachable", message: "down", fresh: false }, null, counters, FROM, TO)).toBeNull();
    expect(makeReport(null, inForce, counters, TO, FROM)).toMatchObject({ from: FROM, to: FROM });
    expect(makeReport(null, inForce, { ...counters, unknownTags: ["ok", "y".repeat(300)] }, FROM, TO)!.unknownTags).toEqual(["ok"]);
  });
});

describe("StateDir (real files)", () => {
  let dir: string;
  beforeEach(() => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), "agent-state-"));
  });
  afterEach(() => {
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it("writes atomically: a reader holding the old file keeps the old bytes, and no temporary file stays", () => {
    const file = path.join(dir, "f.json");
    writeFileAtomic(file, "old");
    const fd = fs.openSync(file, "r");
    writeFileAtomic(file, "new");
    const buf = Buffer.alloc(3);
    fs.readSync(fd, buf, 0, 3, 0);
    fs.closeSync(fd);
    expect(buf.toString()).toBe("old");
    expect(fs.readFileSync(file, "utf8")).toBe("new");
    expect(fs.readdirSync(dir)).toEqual(["f.json"]);
    expect(fs.statSync(file).mode & 0o777).toBe(0o600);
  });

  it("keeps the bundle, the memory and the outbox; the outbox lists reports oldest first", () => {
    const state = new StateDir(path.join(dir, "s"));
    expect(state.readBundle()).toBeNull();
    expect(state.readKeys()).toBeNull();
    state.writeBundle(inForce);
    expect(state.readBundle()).toEqual(inForce);
    state.updateState({ freshAt: 5 });
    expect(state.updateState({ countedTo: TO })).toEqual({ freshAt: 5, countedTo: TO });
    const later = makeReport(null, inForce, counters, TO, "2026-12-01T10:02:00.000Z")!;
    const earlier = makeReport(null, inForce, counters, FROM, TO)!;
    state.putReport(later);
    state.putReport(earlier);
    const pending = state.pendingReports();
    expect(pending.map((p) => p.report.report)).toEqual([earlier.report, later.report]);
    state.removeReport(pending[0].file);
    expect(state.pendingReports().map((p) => p.report)).toEqual([later]);
  });
});
