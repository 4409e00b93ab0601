import { describe, expect, it } from "vitest";
import { GET as listSetsRoute, POST as postSetRoute } from "@/app/api/sites/[site]/groups/[groupId]/samples/route";
import { DELETE as deleteSetRoute, GET as getSetRoute } from "@/app/api/sample-sets/[sampleSetId]/route";
import { GET as setDataRoute } from "@/app/api/sample-sets/[sampleSetId]/data/route";
import { GET as estimateRoute } from "@/app/api/sites/[site]/estimate/route";
import { GET as fleetRoute } from "@/app/api/estimates/route";
import { previewProfile } from "@/lib/preview";
import { decodeSeriesWire, encodeSeriesWire } from "@/lib/samples/wire";
import { convertUnit } from "@/lib/units";
import type { Series } from "@/lib/reduction";
import { Assignment, SampleSet, Tag } from "@/models";
import { NextRequest } from "next/server";
import { createGateway, createGroup, createProfile, createSite, createUser, ctx, request, sessionCookie } from "../factories";

function walk(n: number, seed = 7, stepMs = 1000, fractional = false): Series {
  let x = seed;
  const rand = () => ((x = (x * 16807) % 2147483647) / 2147483647);
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  let level = 70;
  for (let i = 0; i < n; i++) {
    t[i] = 1_790_000_000_000 + i * stepMs + (fractional ? 0.25 : 0);
    level += (rand() - 0.5) * 0.2;
    v[i] = level + (i % 3000 < 100 ? 5 : 0);
  }
  return { t, v };
}

async function post(site: string, groupId: number, user: Awaited<ReturnType<typeof createUser>>, query: string, body: ArrayBuffer) {
  const headers = new Headers({ "content-type": "application/octet-stream" });
  const cookie = await sessionCookie(user);
  if (cookie) headers.set("cookie", cookie);
  const req = new NextRequest(`http://127.0.0.1/api/sites/${site}/groups/${groupId}/samples?${query}`, { method: "POST", headers, body });
  const res = await postSetRoute(req, ctx({ site, groupId: String(groupId) }));
  return { status: res.status, body: await res.json() };
}

describe("sample sets", () => {
  it("stores a set losslessly (Gorilla for whole-ms times, deflate otherwise), lists, serves and deletes it", async () => {
    const site = await createSite();
    const gw = await createGateway(site);
    const group = await createGroup(site, { patterns: ["PAST1/*/PV"] });
    await Tag.create({ siteId: site.id, gatewayId: gw.id, name: "PAST1/TT-1/PV", unit: "degC", samplePeriodMs: 1000, kind: "analog", euLow: 0, euHigh: 150, area: null, equipment: null });
    const engineer = await createUser({ role: "engineer" });
    const s = walk(5000);
    s.q = new Uint8Array(5000);
    s.q.fill(2, 100, 130);
    const created = await post(site.slug, group.id, engineer, "name=Holding%20tube%20day&tag=PAST1/TT-1/PV", encodeSeriesWire(s));
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: "Holding tube day", samples: 5000, tag: { name: "PAST1/TT-1/PV", unit: "degC", euHigh: 150 } });
    const row = (await SampleSet.findByPk(created.body.id))!;
    expect(row.encoding).toBe("gorilla/1");
    expect(row.byteSize).toBeLessThan(16 * 5000);

    const data = await setDataRoute(await request("GET", "/", { user: engineer }), ctx({ sampleSetId: String(row.id) }));
    const back = decodeSeriesWire(await data.arrayBuffer());
    expect(back.ok).toBe(true);
    if (back.ok) {
      expect(Array.from(back.series.t)).toEqual(Array.from(s.t));
      expect(Array.from(back.series.v)).toEqual(Array.from(s.v));
      expect(Array.from(back.series.q!)).toEqual(Array.from(s.q));
    }
    const frac = walk(300, 3, 1000, true);
    const other = await post(site.slug, group.id, engineer, "name=frac&tag=X/1&kind=analog&unit=degC&samplePeriodMs=1000&euLow=0&euHigh=100", encodeSeriesWire(frac));
    expect(other.status).toBe(201);
    expect((await SampleSet.findByPk(other.body.id))!.encoding).toBe("f64-deflate/1");
    const fracBack = decodeSeriesWire(await (await setDataRoute(await request("GET", "/", { user: engineer }), ctx({ sampleSetId: String(other.body.id) }))).arrayBuffer());
    if (fracBack.ok) expect(Array.from(fracBack.series.t)).toEqual(Array.from(frac.t));

    const list = await (await listSetsRoute(await request("GET", "/", { user: engineer }), ctx({ site: site.slug, groupId: String(group.id) }))).json();
    expect(list.sampleSets.map((x: { name: string }) => x.name)).toEqual(["frac", "Holding tube day"]);
    expect((await getSetRoute(await request("GET", "/", { user: engineer }), ctx({ sampleSetId: String(row.id) }))).status).toBe(200);
    expect((await deleteSetRoute(await request("DELETE", "/", { user: engineer }), ctx({ sampleSetId: String(row.id) }))).status).toBe(204);
    expect((await getSetRoute(await request("GET", "/", { user: engineer }), ctx({ sampleSetId: String(row.id) }))).status).toBe(404);
  });

  it("refuses bad bodies and bad tag context with a 4xx naming the field, storing nothing", async () => {
    const site = await createSite();
    const group = await createGroup(site);
    const engineer = await createUser({ role: "engineer" });
    const before = await SampleSet.count();
    const good = encodeSeriesWire(walk(100));
    const q = "name=x&tag=NOT/IN/INVENTORY&kind=analog&unit=degC&samplePeriodMs=1000";
    expect(await post(site.slug, group.id, engineer, q, new TextEncoder().encode("time,value\n").buffer as ArrayBuffer)).toMatchObject({ status: 422, body: { field: "body" } });
    const unsorted = walk(100);
    unsorted.t[50] = unsorted.t[10];
    const bad = await post(site.slug, group.id, engineer, q, encodeSeriesWire(unsorted));
    expect(bad).toMatchObject({ status: 422, body: { field: "body" } });
    expect(bad.body.error).toMatch(/50/);
    expect(await post(site.slug, group.id, engineer, "name=x&tag=NOT/IN/INVENTORY", good)).toMatchObject({ status: 422, body: { field: "kind" } });
    expect(await post(site.slug, group.id, engineer, "tag=A", good)).toMatchObject({ status: 422, body: { field: "name" } });
    expect(await post(site.slug, group.id, engineer, `${q}&euLow=5`, good)).toMatchObject({ status: 422, body: { field: "euLow" } });
    const tooMany = await post(site.slug, group.id, engineer, q, encodeSeriesWire(walk(1_000_001)));
    expect(tooMany).toMatchObject({ status: 413, body: { field: "body" } });
    expect(await post(site.slug, 999999, engineer, q, good)).toMatchObject({ status: 404, body: { field: "group" } });
    expect((await post(site.slug, group.id, await createUser({ role: "viewer" }), q, good)).status).toBe(403);
    expect(await SampleSet.count()).toBe(before);
  });
});

describe("savings estimates", () => {
  it("matches hand-computed figures: 1,000 tags every second, 1-minute mean, 16 B + 10 % per sample", async () => {
    const site = await createSite();
    await site.update({ uplinkBudgetKbps: 256, uplinkHeadroomPct: 20, bytesPerSample: 16, transportOverheadPct: 10, storagePricePerGbMonth: 0.02, retentionMonths: 12 });
    const gw = await createGateway(site);
    await Tag.bulkCreate(
      Array.from({ length: 1000 }, (_, i) => ({ siteId: site.id, gatewayId: gw.id, name: `LINE/TT-${i}/PV`, unit: "degC", samplePeriodMs: 1000, kind: "analog" as const, euLow: 0, euHigh: 100, area: null, equipment: null })),
    );
    const group = await createGroup(site, { patterns: ["LINE/*/PV"] });
    const { revision } = await createProfile({ outputs: [{ name: "avg", steps: [{ method: "aggregate", fn: "mean", window: 60 }] }] });
    await Assignment.create({ groupId: group.id, profileRevisionId: revision.id, overrides: [], updatedBy: null });
    const viewer = await createUser({ role: "viewer" });
    const e = await (await estimateRoute(await request("GET", "/", { user: viewer }), ctx({ site: site.slug }))).json();
    const g = e.working.groups[0];
    // 1,000 tags × 86,400 s ÷ 1 s = 86,400,000 samples a day; a 60 s window keeps 1,440 a day per tag.
    expect(g.samplesPerDayIn).toBe(86_400_000);
    expect(g.samplesPerDayOut).toBeCloseTo(1_440_000, 6);
    expect(g.outputs[0]).toMatchObject({ output: "avg", ratio: 60, source: "window" });
    // 1,440,000 × 16 B × 1.1 = 25,344,000 B/day; × 8 ÷ 86,400 s ÷ 1,000 = 2.34667 kbit/s.
    expect(g.bytesPerDayPlain).toBeCloseTo(25_344_000, 3);
    expect(g.meanKbps).toBeCloseTo(2.346_666_7, 5);
    expect(g.peakKbps).toBeCloseTo(2.346_666_7, 5);
    // Usable 256 × 0.8 = 204.8 kbit/s; a 1 h outage leaves 2.34667 × 3,600 = 8,448 kbit, drained at 204.8 − 2.34667.
    expect(e.working.usableKbps).toBeCloseTo(204.8, 9);
    expect(e.working.catchUp[0]).toMatchObject({ outageS: 3600 });
    expect(e.working.catchUp[0].seconds).toBeCloseTo(8448 / (204.8 - 2.346_666_67), 3);
    expect(e.working.overBudgetMean).toBe(false);
    expect(e.released).toBeNull();
    expect(e.assumptions.join(" ")).toMatch(/16 bytes/);
  });

  it("uses a group's sample set for the ratio and its busiest hour for the peak", async () => {
    const site = await createSite();
    await site.update({ uplinkBudgetKbps: 0.01 });
    const gw = await createGateway(site);
    await Tag.create({ siteId: site.id, gatewayId: gw.id, name: "PAST1/TT-1/PV", unit: "degC", samplePeriodMs: 1000, kind: "analog", euLow: 0, euHigh: 150, area: null, equipment: null });
    const group = await createGroup(site, { patterns: ["PAST1/*/PV"] });
    const { revision } = await createProfile({ outputs: [{ name: "shape", steps: [{ method: "swinging-door", deviation: { value: 0.3, unit: "degC" } }] }] });
    await Assignment.create({ groupId: group.id, profileRevisionId: revision.id, overrides: [], updatedBy: null });
    const engineer = await createUser({ role: "engineer" });
    const s = walk(3 * 3600);
    // A noisy upset in the second hour: swinging door keeps far more there.
    for (let i = 3600; i < 7200; i++) s.v[i] += (i % 2) * 3;
    expect((await post(site.slug, group.id, engineer, "name=upset&tag=PAST1/TT-1/PV", encodeSeriesWire(s))).status).toBe(201);
    const e = await (await estimateRoute(await request("GET", "/", { user: engineer }), ctx({ site: site.slug }))).json();
    const out = e.working.groups[0].outputs[0];
    const tag = { name: "PAST1/TT-1/PV", kind: "analog" as const, unit: "degC", euLow: 0, euHigh: 150, samplePeriodMs: 1000 };
    const direct = previewProfile(s, revision.document, tag, { convert: convertUnit })[0].metrics;
    expect(out.source).toBe("measured");
    expect(out.ratio).toBeCloseTo(direct.samplesIn / direct.samplesOut, 9);
    expect(out.peakRatio).toBeLessThan(out.ratio / 2);
    expect(e.working.groups[0].sampleSet).toBe("upset");
    expect(e.working.overBudgetMean).toBe(true);
    const fleet = await (await fleetRoute(await request("GET", "/api/estimates", { user: engineer }), undefined)).json();
    expect(fleet.sites.find((r: { slug: string }) => r.slug === site.slug)).toMatchObject({ overBudgetMean: true, released: null });
  });
});
