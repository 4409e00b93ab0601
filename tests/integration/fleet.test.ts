import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as fleetRoute } from "@/app/api/fleet/route";
import type { Actor } from "@/lib/auth/guard";
import { fleetAlertCount, fleetStatus, type FleetGateway } from "@/lib/data/fleet";
import { loadWorkingConfig } from "@/lib/data/groups";
import { publishRelease } from "@/lib/data/releases";
import { ROLES } from "@/lib/permissions";
import { Bundle, Gateway, GatewayReport, type Site, sequelize } from "@/models";
import { createAssignment, createGateway, createGroup, createProfile, createSite, createTag, createUser, request } from "../factories";

// Gateways' columns and reports are set directly, as the check-in write path would leave
// them; every state is judged at an injected time.

const NOW = new Date(Math.floor(Date.now() / 1000) * 1000);
const ago = (s: number) => new Date(NOW.getTime() - s * 1000);
const DAY = 86_400;

let admin: Actor;
let siteA: Site;
let siteB: Site;
const gw: Record<string, Gateway> = {};
let targetDigest: string;

async function report(g: Gateway, over: { release: number; pointsIn: number; pointsOut: number; receivedAt: Date; status?: "running" | "failed" }) {
  await GatewayReport.create({
    gatewayId: g.id,
    reportId: randomUUID(),
    release: over.release,
    digest: "0".repeat(64),
    status: over.status ?? "running",
    appliedAt: ago(2 * DAY),
    pointsIn: over.pointsIn,
    pointsOut: over.pointsOut,
    fromAt: new Date(over.receivedAt.getTime() - 60_000),
    toAt: over.receivedAt,
    message: null,
    unknownTags: null,
    lowerRelease: false,
    receivedAt: over.receivedAt,
  });
}

const byslug = (gateways: FleetGateway[]) => new Map(gateways.map((g) => [g.slug, g]));

beforeAll(async () => {
  const user = await createUser({ role: "admin" });
  admin = { id: user.id, email: user.email, name: user.name, role: "admin" };
  siteA = await createSite({ name: `Fleet A ${randomUUID().slice(0, 6)}` });
  siteB = await createSite({ name: `Fleet B ${randomUUID().slice(0, 6)}` });
  for (const name of ["current", "edge", "behind", "failing", "stale", "awaiting"]) gw[name] = await createGateway(siteA, { name: `gw ${name}` });
  gw.norelease = await createGateway(siteB, { name: "gw no release" });

  // The current gateway collects one tag in a swinging-door group (stated default 10:1) and one in no group (pass-through).
  await createTag(siteA, gw.current, { name: "AREA/TT-1/PV" });
  await createTag(siteA, gw.current, { name: "OTHER/TT-1/PV" });
  await createTag(siteA, gw.awaiting, { name: "AREA/TT-2/PV" });
  await createTag(siteB, gw.norelease, { name: "ELSE/TT-5/PV" });
  const group = await createGroup(siteA, { patterns: ["AREA/*/PV"] });
  await createAssignment(group, (await createProfile()).revision);
  const config = await loadWorkingConfig(siteA.id);
  for (let i = 0; i < 2; i++) await sequelize.transaction((t) => publishRelease(siteA, config, { changeId: null, actor: admin }, t));

  for (const g of Object.values(gw)) await g.reload();
  targetDigest = (await Bundle.findByPk(gw.current.currentBundleId!))!.digest;
  const running = { lastStatus: "running" as const, appliedAt: ago(DAY) };
  await gw.current.update({ ...running, runningRelease: 2, runningDigest: targetDigest, lastCheckInAt: ago(30), unknownTags: ["AREA/TT-1/PV", "NEW/TT-9/PV", "ELSE/TT-5/PV", "NEW/TT-8/PV"] });
  // Exactly three poll intervals (3 × 60 s) without a check-in is not yet stale.
  await gw.edge.update({ ...running, runningRelease: 2, runningDigest: targetDigest, lastCheckInAt: ago(180) });
  await gw.behind.update({ ...running, runningRelease: 1, runningDigest: "1".repeat(64), lastCheckInAt: ago(20), lowerReleaseReported: 1 });
  await gw.failing.update({ lastStatus: "failed", lastMessage: "bundle signature did not verify", failingSince: ago(600), runningRelease: 1, lastCheckInAt: ago(10) });
  await gw.stale.update({ ...running, runningRelease: 2, runningDigest: "f".repeat(64), lastCheckInAt: ago(181) });

  await report(gw.current, { release: 2, pointsIn: 1000, pointsOut: 100, receivedAt: ago(3600) });
  await report(gw.current, { release: 2, pointsIn: 500, pointsOut: 50, receivedAt: ago(7200) });
  await report(gw.current, { release: 1, pointsIn: 1000, pointsOut: 1000, receivedAt: ago(3 * 3600) }); // another release
  await report(gw.current, { release: 2, pointsIn: 9000, pointsOut: 1, receivedAt: ago(DAY + 60) }); // older than 24 h
  await report(gw.behind, { release: 1, pointsIn: 100, pointsOut: 0, receivedAt: ago(60) }); // everything dropped
});

describe("fleet status", () => {
  it("derives each gateway's state from its target, its last report and the time", async () => {
    const fleet = await fleetStatus(admin, { site: siteA.slug }, NOW);
    const states = Object.fromEntries(fleet.gateways.map((g) => [g.slug, g.state]));
    expect(states).toEqual({
      [gw.current.slug]: "current",
      [gw.edge.slug]: "current",
      [gw.behind.slug]: "behind",
      [gw.failing.slug]: "failing",
      [gw.stale.slug]: "stale",
      [gw.awaiting.slug]: "awaiting",
    });
    // One millisecond later the edge gateway has missed its third poll.
    const later = await fleetStatus(admin, { site: siteA.slug }, new Date(NOW.getTime() + 1));
    expect(later.gateways.find((g) => g.slug === gw.edge.slug)!.state).toBe("stale");
    const b = await fleetStatus(admin, { site: siteB.slug }, NOW);
    expect(b.gateways.map((g) => [g.slug, g.state, g.targetRelease, g.estimated])).toEqual([[gw.norelease.slug, "no-release", null, null]]);
  });

  it("shows target beside running release, the failure, and the flags", async () => {
    const g = byslug((await fleetStatus(admin, { site: siteA.slug }, NOW)).gateways);
    expect(g.get(gw.current.slug)).toMatchObject({ site: siteA.slug, siteName: siteA.name, pollSeconds: 60, targetRelease: 2, runningRelease: 2, runningDigest: targetDigest, targetDigest, failureMessage: null });
    expect(g.get(gw.current.slug)!.lastCheckInAt).toEqual(ago(30));
    expect(g.get(gw.current.slug)!.staleAt).toEqual(new Date(ago(30).getTime() + 180_000));
    expect(g.get(gw.current.slug)!.flags).toEqual({ lowerReleaseReported: null, digestMismatch: false });
    expect(g.get(gw.behind.slug)).toMatchObject({ targetRelease: 2, runningRelease: 1, flags: { lowerReleaseReported: 1, digestMismatch: false } });
    expect(g.get(gw.failing.slug)).toMatchObject({ failureMessage: "bundle signature did not verify", failingSince: ago(600) });
    expect(g.get(gw.stale.slug)!.flags.digestMismatch).toBe(true);
    expect(g.get(gw.awaiting.slug)).toMatchObject({ targetRelease: 2, runningRelease: null, lastCheckInAt: null, staleAt: null });
  });

  it("measures the ratio over the last 24 h of reports for the running release, beside the estimate", async () => {
    const g = byslug((await fleetStatus(admin, { site: siteA.slug }, NOW)).gateways);
    expect(g.get(gw.current.slug)!.measured).toEqual({ ratio: 10, pointsIn: 1500, pointsOut: 150, reports: 2 });
    expect(g.get(gw.behind.slug)!.measured).toEqual({ ratio: null, pointsIn: 100, pointsOut: 0, reports: 1 });
    expect(g.get(gw.awaiting.slug)!.measured).toBeNull();
    // 2 tags × 86,400 samples a day in; out: 8,640 (swinging door, 10:1) + 86,400 (passed through).
    const est = g.get(gw.current.slug)!.estimated!;
    expect(est.release).toBe(2);
    expect(est.samplesPerDayIn).toBe(2 * 86_400);
    expect(est.samplesPerDayOut).toBeCloseTo(8_640 + 86_400, 6);
    expect(est.ratio).toBeCloseTo(172_800 / 95_040, 9);
    // Before its first check-in a gateway is estimated for its target release.
    expect(g.get(gw.awaiting.slug)!.estimated).toMatchObject({ release: 2, ratio: 10 });
    // Running release 1 is estimated for release 1; a gateway without tags sends nothing.
    expect(g.get(gw.behind.slug)!.estimated).toEqual({ release: 1, ratio: null, samplesPerDayIn: 0, samplesPerDayOut: 0 });
  });

  it("lists the unknown tags the site's inventory still lacks", async () => {
    const g = byslug((await fleetStatus(admin, { site: siteA.slug }, NOW)).gateways);
    // AREA/TT-1/PV is in the inventory; ELSE/TT-5/PV is, but at another site.
    expect(g.get(gw.current.slug)!.unknownTags).toEqual(["NEW/TT-9/PV", "ELSE/TT-5/PV", "NEW/TT-8/PV"]);
    await createTag(siteA, gw.current, { name: "NEW/TT-9/PV" });
    const after = byslug((await fleetStatus(admin, { site: siteA.slug }, NOW)).gateways);
    expect(after.get(gw.current.slug)!.unknownTags).toEqual(["ELSE/TT-5/PV", "NEW/TT-8/PV"]);
    expect(after.get(gw.awaiting.slug)!.unknownTags).toEqual([]);
  });

  it("rolls states up per site, whatever the state filter", async () => {
    const fleet = await fleetStatus(admin, {}, NOW);
    const a = fleet.sites.find((s) => s.slug === siteA.slug)!;
    expect(a).toEqual({
      slug: siteA.slug,
      name: siteA.name,
      gateways: 6,
      alerts: 2,
      counts: { current: 2, behind: 1, failing: 1, stale: 1, awaiting: 1, "no-release": 0 },
    });
    expect(fleet.sites.find((s) => s.slug === siteB.slug)!.counts["no-release"]).toBe(1);
    // Gateways come by site, in the roll-up's order, then by name (the database's collation).
    const siteIndex = fleet.gateways.map((g) => fleet.sites.findIndex((s) => s.slug === g.site));
    expect(siteIndex).toEqual([...siteIndex].sort((x, y) => x - y));
    expect(fleet.gateways.filter((g) => g.site === siteA.slug).map((g) => g.name)).toEqual(["gw awaiting", "gw behind", "gw current", "gw edge", "gw failing", "gw stale"]);
    const failing = await fleetStatus(admin, { state: "failing" }, NOW);
    expect(failing.sites.find((s) => s.slug === siteA.slug)).toEqual(a);
    expect(failing.gateways.every((g) => g.state === "failing")).toBe(true);
    expect(failing.gateways.map((g) => g.slug)).toContain(gw.failing.slug);
  });

  it("filters by site and by state", async () => {
    const a = await fleetStatus(admin, { site: siteA.slug, state: "behind" }, NOW);
    expect(a.sites.map((s) => s.slug)).toEqual([siteA.slug]);
    expect(a.gateways.map((g) => g.slug)).toEqual([gw.behind.slug]);
    const b = await fleetStatus(admin, { site: siteB.slug }, NOW);
    expect(b.gateways.map((g) => g.site)).toEqual([siteB.slug]);
    expect(b.checkedIn).toBe(0);
    await expect(fleetStatus(admin, { site: "no-such-site-here" }, NOW)).rejects.toMatchObject({ status: 422, field: "site" });
    await expect(fleetStatus(admin, { state: "sleepy" }, NOW)).rejects.toMatchObject({ issues: [expect.objectContaining({ path: ["state"] })] });
  });

  it("reads the fleet in the same number of queries for one gateway or six", async () => {
    const count = async (site: string) => {
      let n = 0;
      const hook = () => void n++;
      sequelize.addHook("beforeQuery", "count-fleet", hook);
      try {
        await fleetStatus(admin, { site }, NOW);
      } finally {
        sequelize.removeHook("beforeQuery", "count-fleet");
      }
      return n;
    };
    const single = await createSite();
    const lone = await createGateway(single);
    await createTag(single, lone, { name: "AREA/TT-1/PV" });
    const g2 = await createGroup(single, { patterns: ["AREA/*/PV"] });
    await createAssignment(g2, (await createProfile()).revision);
    await sequelize.transaction(async (t) => publishRelease(single, await loadWorkingConfig(single.id, t), { changeId: null, actor: admin }, t));
    await lone.update({ lastStatus: "running", runningRelease: 1, lastCheckInAt: ago(5), unknownTags: ["X/Y"] });
    await report(lone, { release: 1, pointsIn: 10, pointsOut: 1, receivedAt: ago(5) });
    await count(siteA.slug); // warm the estimate cache for both
    await count(single.slug);
    expect(await count(single.slug)).toBe(await count(siteA.slug));
    expect(await count(siteA.slug)).toBeLessThanOrEqual(10);
  });

  it("counts stale and failing gateways for the badge in one query", async () => {
    const before = await fleetAlertCount(admin, NOW);
    let queries = 0;
    sequelize.addHook("beforeQuery", "count-badge", () => void queries++);
    try {
      await fleetAlertCount(admin, NOW);
    } finally {
      sequelize.removeHook("beforeQuery", "count-badge");
    }
    expect(queries).toBe(1);
    // The edge gateway turns stale a millisecond later; a gateway that reports a failure adds one more.
    expect(await fleetAlertCount(admin, new Date(NOW.getTime() + 1))).toBe(before + 1);
    await gw.behind.update({ lastStatus: "failed" });
    expect(await fleetAlertCount(admin, NOW)).toBe(before + 1);
    await gw.behind.update({ lastStatus: "running" });
    expect(await fleetAlertCount(admin, NOW)).toBe(before);
    // The count agrees with the states the fleet status shows.
    const fleet = await fleetStatus(admin, {}, NOW);
    expect(fleet.gateways.filter((g) => g.state === "stale" || g.state === "failing")).toHaveLength(before);
  });
});

describe("GET /api/fleet", () => {
  it("answers every role with ISO times and the fields the browser and the agent tests read", async () => {
    for (const role of ROLES) {
      const user = await createUser({ role });
      const res = await fleetRoute(await request("GET", `/api/fleet?site=${siteA.slug}&state=failing`, { user }), {});
      expect(res.status, role).toBe(200);
      const body = await res.json();
      expect(body.sites.map((s: { slug: string }) => s.slug)).toEqual([siteA.slug]);
      expect(body.gateways).toHaveLength(1);
      expect(body.gateways[0]).toMatchObject({
        site: siteA.slug,
        slug: gw.failing.slug,
        state: "failing",
        targetRelease: 2,
        runningRelease: 1,
        lastCheckInAt: ago(10).toISOString(),
        failingSince: ago(600).toISOString(),
        failureMessage: "bundle signature did not verify",
      });
    }
    const signedOut = await fleetRoute(await request("GET", "/api/fleet"), {});
    expect(signedOut.status).toBe(401);
    await expect(fleetStatus(null)).rejects.toMatchObject({ status: 401 });
    await expect(fleetAlertCount(null)).rejects.toMatchObject({ status: 401 });
  });

  it("refuses a bad state or site with 422 naming the field", async () => {
    const user = await createUser({ role: "viewer" });
    for (const [query, field] of [
      ["state=sleepy", "state"],
      ["site=Not%20A%20Slug", "site"],
      ["site=no-such-site-here", "site"],
    ]) {
      const res = await fleetRoute(await request("GET", `/api/fleet?${query}`, { user }), {});
      expect(res.status, query).toBe(422);
      expect((await res.json()).field, query).toBe(field);
    }
  });
});
