import { describe, expect, it } from "vitest";
import { DELETE as deleteTagsRoute, GET as listTagsRoute, POST as createTagRoute } from "@/app/api/sites/[site]/tags/route";
import { PATCH as patchTagRoute } from "@/app/api/sites/[site]/tags/[tagId]/route";
import { POST as importRoute } from "@/app/api/sites/[site]/tags/import/route";
import { GET as exportRoute } from "@/app/api/sites/[site]/tags/export/route";
import { DELETE as deleteGatewayRoute } from "@/app/api/sites/[site]/gateways/[gateway]/route";
import { AuditEvent, Tag } from "@/models";
import { createGateway, createSite, createTag, createUser, ctx, request } from "../factories";
import { tagBody } from "./matrix/samples";

async function setup() {
  const site = await createSite();
  const gw = await createGateway(site, { slug: `gw-a-${site.id}` });
  const gw2 = await createGateway(site, { slug: `gw-b-${site.id}` });
  const engineer = await createUser({ role: "engineer" });
  return { site, gw, gw2, engineer, p: ctx({ site: site.slug }) };
}

const names = async (siteId: number) => (await Tag.findAll({ where: { siteId }, order: [["name", "ASC"]] })).map((t) => t.name);

describe("tag inventory API", () => {
  it("adds, edits and deletes tags, each write audited", async () => {
    const { site, gw, gw2, engineer, p } = await setup();
    const body = tagBody(gw.slug);
    const created = await createTagRoute(await request("POST", "/", { user: engineer, body }), p);
    expect(created.status).toBe(201);
    const tag = await created.json();
    expect(tag).toMatchObject({ ...body, id: expect.any(Number) });
    const edited = await patchTagRoute(
      await request("PATCH", "/", { user: engineer, body: { ...body, unit: "degF", euLow: 32, euHigh: 302, gateway: gw2.slug } }),
      ctx({ site: site.slug, tagId: String(tag.id) }),
    );
    expect(edited.status).toBe(200);
    expect(await edited.json()).toMatchObject({ unit: "degF", euLow: 32, euHigh: 302, gateway: gw2.slug });
    const list = await (await listTagsRoute(await request("GET", "/", { user: engineer }), p)).json();
    expect(list).toMatchObject({ total: 1, tags: [{ name: body.name, unit: "degF" }] });
    const del = await deleteTagsRoute(await request("DELETE", "/", { user: engineer, body: { ids: [tag.id] } }), p);
    expect(await del.json()).toEqual({ deleted: 1 });
    const audit = await AuditEvent.findAll({ where: { siteId: site.id }, order: [["id", "ASC"]] });
    expect(audit.map((a) => a.action)).toEqual(["tag.create", "tag.update", "tag.delete"]);
    expect(audit[1].beforeJson).toMatchObject({ unit: "degC", gateway: gw.slug });
    expect(audit[1].afterJson).toMatchObject({ unit: "degF", gateway: gw2.slug });
  });

  it("names the field of bad input", async () => {
    const { gw, engineer, p } = await setup();
    const cases: [Record<string, unknown>, string][] = [
      [{ kind: "analogue" }, "kind"],
      [{ euLow: 10, euHigh: 5 }, "euHigh"],
      [{ unit: "" }, "unit"],
      [{ samplePeriodMs: 0 }, "samplePeriodMs"],
    ];
    for (const [patch, field] of cases) {
      const res = await createTagRoute(await request("POST", "/", { user: engineer, body: { ...tagBody(gw.slug), ...patch } }), p);
      expect(res.status, JSON.stringify(patch)).toBe(422);
      expect(await res.json(), JSON.stringify(patch)).toMatchObject({ field });
    }
    const unknownGw = await createTagRoute(await request("POST", "/", { user: engineer, body: tagBody("no-such-gw") }), p);
    expect(unknownGw.status).toBe(422);
    expect(await unknownGw.json()).toMatchObject({ field: "gateway" });
    const body = tagBody(gw.slug);
    await createTagRoute(await request("POST", "/", { user: engineer, body }), p);
    const dup = await createTagRoute(await request("POST", "/", { user: engineer, body }), p);
    expect(dup.status).toBe(409);
    expect(await dup.json()).toMatchObject({ field: "name" });
    const badPage = await listTagsRoute(await request("GET", "/?limit=0", { user: engineer }), p);
    expect(await badPage.json()).toMatchObject({ field: "limit" });
  });

  it("treats tag names as case-sensitive", async () => {
    const { site, gw, engineer, p } = await setup();
    await createTagRoute(await request("POST", "/", { user: engineer, body: { ...tagBody(gw.slug), name: "PAST1/TT-101/PV" } }), p);
    const lower = await createTagRoute(await request("POST", "/", { user: engineer, body: { ...tagBody(gw.slug), name: "past1/tt-101/pv" } }), p);
    expect(lower.status).toBe(201);
    expect(await names(site.id)).toEqual(["PAST1/TT-101/PV", "past1/tt-101/pv"]);
  });

  it("refuses to delete a gateway that still collects tags, saying why", async () => {
    const { site, gw } = await setup();
    const admin = await createUser({ role: "admin" });
    await createTag(site, gw);
    const res = await deleteGatewayRoute(await request("DELETE", "/", { user: admin }), ctx({ site: site.slug, gateway: gw.slug }));
    expect(res.status).toBe(409);
    expect((await res.json()).error).toContain("1 tag is collected by it");
  });
});

describe("tag import", () => {
  it("writes nothing when one row is bad, and names the row", async () => {
    const { site, gw, engineer, p } = await setup();
    await createTag(site, gw, { name: "KEEP/TT-1/PV" });
    const rows = [tagBody(gw.slug), tagBody(gw.slug), { ...tagBody(gw.slug), kind: "thermometer" }];
    const res = await importRoute(await request("POST", "/", { user: engineer, body: { rows } }), p);
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.field).toBe("rows.2.kind");
    expect(await names(site.id)).toEqual(["KEEP/TT-1/PV"]);
    expect(await AuditEvent.count({ where: { siteId: site.id, action: "tags.import" } })).toBe(0);
  });

  it("upserts by name, and removes exactly the listed missing tags", async () => {
    const { site, gw, engineer, p } = await setup();
    await createTag(site, gw, { name: "OLD/TT-1/PV" });
    await createTag(site, gw, { name: "OLD/TT-2/PV" });
    await createTag(site, gw, { name: "SAME/TT-3/PV" });
    const rows = [
      { ...tagBody(gw.slug), name: "SAME/TT-3/PV", unit: "degF", euLow: 32, euHigh: 300 },
      { ...tagBody(gw.slug), name: "NEW/TT-4/PV" },
    ];
    const plan = await (await importRoute(await request("POST", "/", { user: engineer, body: { rows, dryRun: true } }), p)).json();
    expect(plan).toEqual({ added: ["NEW/TT-4/PV"], updated: ["SAME/TT-3/PV"], unchanged: 0, missing: ["OLD/TT-1/PV", "OLD/TT-2/PV"], removed: [] });
    expect(await names(site.id)).toEqual(["OLD/TT-1/PV", "OLD/TT-2/PV", "SAME/TT-3/PV"]);

    // A removal list that is not exactly what is missing is refused.
    const partial = await importRoute(await request("POST", "/", { user: engineer, body: { rows, remove: ["OLD/TT-1/PV"] } }), p);
    expect(partial.status).toBe(409);
    expect(await partial.json()).toMatchObject({ field: "remove" });

    const done = await (await importRoute(await request("POST", "/", { user: engineer, body: { rows, remove: plan.missing } }), p)).json();
    expect(done.removed).toEqual(["OLD/TT-1/PV", "OLD/TT-2/PV"]);
    expect(await names(site.id)).toEqual(["NEW/TT-4/PV", "SAME/TT-3/PV"]);
    expect((await Tag.findOne({ where: { siteId: site.id, name: "SAME/TT-3/PV" } }))!.unit).toBe("degF");
    const audit = await AuditEvent.findAll({ where: { siteId: site.id, action: "tags.import" } });
    expect(audit).toHaveLength(1);
    expect(audit[0].afterJson).toMatchObject({ added: 1, updated: 1, removed: 2, tags: 2 });

    // Without a removal list, tags missing from the file stay.
    await importRoute(await request("POST", "/", { user: engineer, body: { rows: [rows[1]] } }), p);
    expect(await names(site.id)).toEqual(["NEW/TT-4/PV", "SAME/TT-3/PV"]);
  });

  it("accepts CSV, reports bad lines with their line numbers, and refuses more than 200,000 rows", async () => {
    const { site, gw, engineer, p } = await setup();
    const header = "name,unit,sample_period_ms,kind,eu_low,eu_high,area,equipment,gateway";
    const good = `${header}\nA/TT-1/PV,degC,1000,analog,0,100,A,,${gw.slug}\nA/XV-1/STATE,state,1000,discrete,,,A,,${gw.slug}\n`;
    const bad = `${header}\nA/TT-1/PV,degC,1000,analog,0,100,A,,${gw.slug}\nA/TT-2/PV,degC,1000,analog,100,0,A,,${gw.slug}\n`;
    const csv = (body: string, qs = "") => request("POST", `/api/sites/${site.slug}/tags/import${qs}`, { user: engineer, rawBody: body }).then((r) => {
      const h = new Headers(r.headers);
      h.set("content-type", "text/csv");
      return new Request(r.url, { method: "POST", headers: h, body });
    });
    const refused = await importRoute(await csv(bad), p);
    expect(refused.status).toBe(422);
    const problem = await refused.json();
    expect(problem.issues[0].field).toMatch(/^line 3/);
    expect(await names(site.id)).toEqual([]);
    const ok = await importRoute(await csv(good), p);
    expect(ok.status).toBe(200);
    expect(await names(site.id)).toEqual(["A/TT-1/PV", "A/XV-1/STATE"]);

    const tooMany = { rows: Array.from({ length: 200_001 }, () => ({})) };
    const big = await importRoute(await request("POST", "/", { user: engineer, body: tooMany }), p);
    expect(big.status).toBe(422);
    expect(await big.json()).toMatchObject({ field: "rows" });
  });

  it("exports CSV that re-imports to the same inventory, with formulas neutralised", async () => {
    const { site, gw, gw2, engineer, p } = await setup();
    const rows = [
      { ...tagBody(gw.slug), name: "=HYPERLINK(\"x\")/TT-1/PV", area: "+AREA", equipment: "@EQ" },
      { ...tagBody(gw2.slug), name: "B/TT-2/PV", euLow: -40, euHigh: 60, area: null },
      { ...tagBody(gw.slug), name: "C/FQ-1/TOT", kind: "counter", unit: "m3", euLow: null, euHigh: null, samplePeriodMs: 10000 },
    ];
    await importRoute(await request("POST", "/", { user: engineer, body: { rows } }), p);
    const exported = await exportRoute(await request("GET", "/", { user: engineer }), p);
    expect(exported.headers.get("content-type")).toContain("text/csv");
    const text = await exported.text();
    expect(text).toContain("'=HYPERLINK");
    expect(text).toContain("'+AREA");
    expect(text).toMatch(/,-40,60,/);
    const before = (await (await listTagsRoute(await request("GET", "/", { user: engineer }), p)).json()).tags;
    // Re-import the exported file into an emptied inventory: the same tags come back.
    await Tag.destroy({ where: { siteId: site.id } });
    const csvReq = new Request(`http://127.0.0.1/api/sites/${site.slug}/tags/import`, {
      method: "POST",
      headers: { "content-type": "text/csv", cookie: (await request("GET", "/", { user: engineer })).headers.get("cookie")! },
      body: text,
    });
    expect((await importRoute(csvReq, p)).status).toBe(200);
    const after = (await (await listTagsRoute(await request("GET", "/", { user: engineer }), p)).json()).tags;
    const strip = (ts: { id: number }[]) => ts.map(({ id: _id, ...t }) => t);
    expect(strip(after)).toEqual(strip(before));
  });
});
