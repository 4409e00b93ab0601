import { beforeAll, describe, expect, it } from "vitest";
import { DELETE as deleteTagsRoute, POST as createTagRoute } from "@/app/api/sites/[site]/tags/route";
import { DELETE as deleteTagRoute, PATCH as patchTagRoute } from "@/app/api/sites/[site]/tags/[tagId]/route";
import { POST as importRoute } from "@/app/api/sites/[site]/tags/import/route";
import { POST as createGroupRoute } from "@/app/api/sites/[site]/groups/route";
import { DELETE as deleteGroupRoute, PATCH as patchGroupRoute } from "@/app/api/sites/[site]/groups/[groupId]/route";
import { PUT as orderRoute } from "@/app/api/sites/[site]/groups/order/route";
import { POST as previewRoute } from "@/app/api/sites/[site]/groups/preview/route";
import { POST as discardRoute } from "@/app/api/sites/[site]/draft/discard/route";
import { loadWorkingConfig } from "@/lib/data/groups";
import { Tag, TagGroup, TagGroupRule, type User } from "@/models";
import { createGateway, createGroup, createSite, createTag, createUser } from "../../factories";
import { ROUTE_SAMPLES, groupBody, makeFixture, tagBody, type Fixture } from "../matrix/samples";
import { AREAS, Hostile, TEN_MB, bodyCases, fieldCases, paramCases, rowOf, type Case, type Field, type RouteSpec, type Sample } from "./harness";

// Hostile input against the tag inventory (one tag, bulk delete, JSON and CSV import) and
// tag groups (create, edit, delete, order, preview) and the draft discard.

const h = new Hostile("tags, groups, CSV import, draft");
const MIN_CASES = 900;
const SLOW = 180_000;

let engineer: User;
let fx: Fixture;
let otherSiteTag = 0;

const tagFields = (prefix: (string | number)[] = []): Field[] => [
  { path: [...prefix, "name"], type: "text", text: "name", max: 191, required: true },
  { path: [...prefix, "unit"], type: "text", text: "name", max: 32, required: true },
  { path: [...prefix, "samplePeriodMs"], type: "number", range: [1, 86_400_000], int: true, required: true },
  { path: [...prefix, "kind"], type: "enum", required: true },
  { path: [...prefix, "euLow"], type: "number", nullable: true },
  { path: [...prefix, "euHigh"], type: "number", nullable: true },
  // Area and equipment may hold line breaks (tests/unit/tags/csv.test.ts), never NUL or escapes.
  { path: [...prefix, "area"], type: "text", text: "text", max: 64, nullable: true },
  { path: [...prefix, "equipment"], type: "text", text: "text", max: 64, nullable: true },
  { path: [...prefix, "gateway"], type: "text", required: true },
];

const groupFields: Field[] = [
  { path: ["name"], type: "text", text: "name", max: 80, required: true },
  { path: ["description"], type: "text", text: "text", max: 500 },
  { path: ["regulated"], type: "boolean" },
  { path: ["selector", "patterns"], type: "list", items: "name", mayRefuse: true },
  { path: ["selector", "units"], type: "list", items: "name", max: 32 },
  { path: ["selector", "kinds"], type: "list" },
  { path: ["selector", "areas"], type: "list", items: "text", max: 64 },
  { path: ["selector", "equipment"], type: "list", items: "text", max: 64 },
  { path: ["selector", "gateways"], type: "list", items: "strict" },
  { path: ["selector", "minPeriodMs"], type: "number", range: [1, 86_400_000], int: true, nullable: true },
  { path: ["selector", "maxPeriodMs"], type: "number", range: [1, 86_400_000], int: true, nullable: true },
  { path: ["selector", "include"], type: "list", items: "name", max: 191 },
  { path: ["selector", "exclude"], type: "list", items: "name", max: 191 },
];

const readTag = async (id: number) => {
  const t = await Tag.findByPk(id);
  return t && { name: t.name, unit: t.unit, samplePeriodMs: t.samplePeriodMs, kind: t.kind, euLow: t.euLow, euHigh: t.euHigh, area: t.area, equipment: t.equipment };
};

const readGroup = async (siteId: number, id: number) => {
  const g = await TagGroup.findByPk(id);
  if (!g) return null;
  return (await loadWorkingConfig(siteId)).groups.find((c) => c.name === g.name) ?? null;
};

const groupRows = async (id: number) => ({ group: await rowOf("tag_groups", id), rules: await TagGroupRule.findAll({ where: { groupId: id }, raw: true, order: [["position", "ASC"]] }) });

/** A list of whole numbers (ids) given odd items. */
function idListCases(path: string[], empty: "refuse" | "may" = "refuse"): Case[] {
  const field = new RegExp(`^${path.join("\\.")}(\\.|$)`);
  const items: [string, unknown][] = [
    ["0", 0],
    ["-1", -1],
    ["1.5", 1.5],
    ["1e308", 1e308],
    ["2**53+1", 2 ** 53 + 1],
    ['"1"', "1"],
    ["null", null],
    ["true", true],
    ["[1]", [1]],
    ["10 MB string", TEN_MB],
  ];
  const put = (v: unknown) => (s: Sample) => {
    const body = structuredClone(s.body) as Record<string, unknown>;
    body[path[0]] = v;
    return { ...s, body };
  };
  return [
    ...items.map(([label, v]): Case => ({ category: label.includes("e308") || label.includes("53") ? "huge number" : label.includes("MB") ? "10 MB string" : "wrong type", label: `${path.join(".")} item ${label}`, build: put([v]), field })),
    { category: "wrong type", label: `${path.join(".")} = []`, build: put([]), field: empty === "refuse" ? field : null, accept: empty === "refuse" ? "never" : "may" },
    { category: "huge number", label: `${path.join(".")} of 200,001 ids`, build: put(Array.from({ length: 200_001 }, (_, i) => i + 1)), field: null },
  ];
}

const CSV_HEADER = "name,unit,sample_period_ms,kind,eu_low,eu_high,area,equipment,gateway";

describe("hostile input: tags, groups, CSV import and draft", () => {
  beforeAll(async () => {
    engineer = await createUser({ role: "engineer" });
    fx = await makeFixture();
    const other = await createSite();
    otherSiteTag = (await createTag(other, await createGateway(other))).id;
  });

  it("covers its share of the write routes", () => {
    expect(AREAS["tags-groups"]).toHaveLength(11);
  });

  it("POST /api/sites/[site]/tags", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/tags",
      handler: createTagRoute,
      user: engineer,
      sample: ROUTE_SAMPLES["POST /api/sites/[site]/tags"].bind(null, fx) as () => Promise<Sample>,
      readBack: async (_s, res) => readTag((res as { id: number }).id),
      fields: tagFields(),
    };
    await h.route(spec, [...bodyCases(), ...fieldCases(tagFields()), ...paramCases(["site"])]);
    await h.fuzzRoute(spec, { seed: 201, runs: 40 });
  }, SLOW);

  it("PATCH /api/sites/[site]/tags/[tagId]", async () => {
    // A site of its own: the names POST took at the fixture's site are free here.
    const site = await createSite();
    const gw = await createGateway(site);
    const fresh = async (): Promise<Sample> => {
      const tag = await createTag(site, gw);
      return { path: "/", params: { site: site.slug, tagId: String(tag.id) }, body: { ...tagBody(gw.slug), name: tag.name } };
    };
    const spec: RouteSpec = {
      key: "PATCH /api/sites/[site]/tags/[tagId]",
      handler: patchTagRoute,
      user: engineer,
      sample: fresh,
      readBack: async (s) => readTag(Number(s.params!.tagId)),
      fields: tagFields(),
      watch: async (s) => rowOf("tags", Number(s.params!.tagId)),
    };
    await h.route(spec, [...bodyCases(), ...fieldCases(tagFields()), ...paramCases(["tagId", "site"])]);
    await h.fuzzRoute(spec, { seed: 202, runs: 40 });
  }, SLOW);

  it("DELETE /api/sites/[site]/tags", async () => {
    const spec: RouteSpec = { key: "DELETE /api/sites/[site]/tags", handler: deleteTagsRoute, user: engineer, sample: ROUTE_SAMPLES["DELETE /api/sites/[site]/tags"].bind(null, fx) as () => Promise<Sample> };
    await h.route(spec, [
      ...bodyCases(),
      { category: "missing field", label: "ids", build: (s) => ({ ...s, body: {} }), field: "ids" },
      ...fieldCases([{ path: ["ids"], type: "list" }]),
      ...idListCases(["ids"]),
      { category: "wrong type", label: "a tag of another site", build: (s) => ({ ...s, params: { site: fx.site.slug }, body: { ids: [otherSiteTag] } }), field: "ids" },
    ]);
    await h.fuzzRoute(spec, { seed: 203, runs: 30 });
  }, SLOW);

  it("DELETE /api/sites/[site]/tags/[tagId]", async () => {
    const spec: RouteSpec = { key: "DELETE /api/sites/[site]/tags/[tagId]", handler: deleteTagRoute, user: engineer, sample: ROUTE_SAMPLES["DELETE /api/sites/[site]/tags/[tagId]"].bind(null, fx) as () => Promise<Sample> };
    await h.route(spec, [...paramCases(["tagId", "site"]), { category: "path param", label: "a tag of another site", build: (s) => ({ ...s, params: { ...s.params, tagId: String(otherSiteTag) } }), field: "tag" }]);
  }, SLOW);

  it("POST /api/sites/[site]/tags/import (JSON rows)", async () => {
    // Its own site, so an import sees exactly the tags it made; not a dry run, so accepted rows are stored.
    const site = await createSite();
    const gw = await createGateway(site);
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/tags/import",
      handler: importRoute,
      user: engineer,
      sample: async () => ({ path: `/api/sites/${site.slug}/tags/import`, params: { site: site.slug }, body: { rows: [tagBody(gw.slug)], dryRun: false } }),
      readBack: async (_s, _res, sent) => {
        const name = ((sent.body as { rows: { name: string }[] }).rows[0].name ?? "").trim();
        const t = await Tag.findOne({ where: { siteId: site.id, name } });
        return { rows: [t && (await readTag(t.id))] };
      },
    };
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases([
        { path: ["rows"], type: "list", required: true },
        { path: ["remove"], type: "list", items: "strict" },
        { path: ["dryRun"], type: "boolean" },
      ]),
      ...fieldCases(tagFields(["rows", 0])),
      { category: "wrong type", label: "a row that is a string", build: (s) => ({ ...s, body: { rows: ["A/TT-1/PV,degC,1000,analog"] } }), field: "rows.0" },
      { category: "wrong type", label: "the same name twice", build: (s) => ({ ...s, body: { rows: [tagBody(gw.slug), tagBody(gw.slug)].map((r, _i, all) => ({ ...r, name: all[0].name })) } }), field: "rows.1.name" },
      { category: "huge number", label: "200,001 rows", build: (s) => ({ ...s, body: { rows: Array.from({ length: 200_001 }, () => ({})) } }), field: "rows" },
      { category: "wrong type", label: "remove names a tag that is not missing", build: (s) => ({ ...s, body: { ...(s.body as object), remove: ["NOT/THERE/PV"] } }), field: "remove" },
    ]);
    await h.fuzzRoute(spec, { seed: 204, runs: 30, paths: tagFields(["rows", 0]).map((f) => f.path) });
  }, SLOW);

  it("POST /api/sites/[site]/tags/import (CSV file)", async () => {
    const site = await createSite();
    const gw = await createGateway(site);
    let n = 0;
    const name = () => `CSV/TT-${++n}/PV`;
    const row = (over: Partial<Record<string, string>> = {}) => {
      const r = { name: name(), unit: "degC", sample_period_ms: "1000", kind: "analog", eu_low: "0", eu_high: "100", area: "A", equipment: "", gateway: gw.slug, ...over };
      return [r.name, r.unit, r.sample_period_ms, r.kind, r.eu_low, r.eu_high, r.area, r.equipment, r.gateway].join(",");
    };
    const csv = (text: string | (() => string), label: string, accept: Case["accept"] = "never", field: Case["field"] = /^line \d+|^file$|^body$/, query = ""): Case => ({
      category: "malformed CSV",
      label,
      build: (s) => ({ ...s, path: `${s.path}${query}`, body: undefined, rawBody: typeof text === "function" ? text() : text, contentType: "text/csv" }),
      accept,
      field: accept === "never" ? field : null,
    });
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/tags/import",
      handler: importRoute,
      user: engineer,
      sample: async () => ({ path: `/api/sites/${site.slug}/tags/import`, params: { site: site.slug } }),
      renew: false,
    };
    const formula = (cell: string, value: string, accept: Case["accept"] = "never") => csv(() => `${CSV_HEADER}\n${row({ [cell]: value })}\n`, `formula in ${cell}: ${value}`, accept);
    await h.route(spec, [
      csv(() => `${CSV_HEADER}\n"${name()},degC,1000,analog,0,100,A,,${gw.slug}\n`, "an unbalanced quote"),
      csv(() => `${CSV_HEADER}\n${row()},extra,cells\n`, "too many cells"),
      csv(() => `${CSV_HEADER}\n${name()},degC,1000\n`, "too few cells"),
      csv("", "an empty file", "never", /^file$|^body$|^line/),
      csv("\uFEFF", "only a BOM", "never", /^file$|^body$|^line/),
      csv(() => `\uFEFF${CSV_HEADER}\n${row()}\n`, "a BOM before a good file", "must"),
      // Headers are compared ignoring anything but letters and digits, so a second BOM is harmless.
      csv(() => `\uFEFF\uFEFF${CSV_HEADER}\n${row()}\n`, "two BOMs", "may"),
      csv(() => `${CSV_HEADER}\r\n${row()}\r\n${row()}\r\n`, "CRLF line ends", "must"),
      csv(() => `name;unit;sample_period_ms;kind;eu_low;eu_high;area;equipment;gateway\n${row()}\n`, "semicolon header, comma rows"),
      csv(() => `tag,unit\n${name()},degC\n`, "required columns missing"),
      // Each column is used once, the first of a name wins (suggestMapping).
      csv(() => `${CSV_HEADER},name\n${row()},X\n`, "a column named twice", "may"),
      csv(() => `${CSV_HEADER}\n"A/TT-${++n}\n/PV",degC,1000,analog,0,100,A,,${gw.slug}\n`, "a line break inside a quoted name"),
      csv(() => `${CSV_HEADER}\n${row({ name: `A/TT-${++n}\u0000/PV` })}\n`, "NUL in a name"),
      csv(() => `${CSV_HEADER}\n${row({ unit: "deg\u001bC" })}\n`, "ESC in a unit"),
      csv(() => `${CSV_HEADER}\n${row({ area: "A\u0007" })}\n`, "BEL in an area"),
      csv(() => `${CSV_HEADER}\n${row({ eu_low: "NaN" })}\n`, "NaN low"),
      csv(() => `${CSV_HEADER}\n${row({ eu_high: "Infinity" })}\n`, "Infinity high"),
      csv(() => `${CSV_HEADER}\n${row({ eu_low: "-1e309", eu_high: "1e309" })}\n`, "range beyond a double"),
      csv(() => `${CSV_HEADER}\n${row({ sample_period_ms: "1e308" })}\n`, "period 1e308"),
      csv(() => `${CSV_HEADER}\n${row({ sample_period_ms: "9007199254740993" })}\n`, "period 2**53+1"),
      csv(() => `${CSV_HEADER}\n${row({ sample_period_ms: "0x10" })}\n`, "period in hex"),
      csv(() => `${CSV_HEADER}\n${row({ name: "x".repeat(192) })}\n`, "a 192-character name"),
      csv(() => `${CSV_HEADER}\n${row({ name: TEN_MB })}\n`, "a 10 MB name"),
      csv(() => `${CSV_HEADER}\n${row({ gateway: "../../etc/passwd" })}\n`, "a path as gateway"),
      csv(() => `${CSV_HEADER}\n${row({ kind: "<script>alert(1)</script>" })}\n`, "markup as kind"),
      csv(() => `${CSV_HEADER}\n${row()}\n${row({ name: `CSV/TT-${n}/PV` })}\n`, "a name twice"),
      // Spreadsheets export trailing empty rows as commas: skipped like blank lines.
      csv(() => `${CSV_HEADER}\n${row()}\n,,,,,,,,\n`, "an empty row of commas", "may"),
      csv("\u0000\u0001\u0002binary\u00ff\u00fe", "binary junk"),
      csv(() => `${CSV_HEADER}\n${row()}\n`, "a CSV body sent as JSON", "never", "body"),
      formula("sample_period_ms", "=1+1"),
      formula("eu_low", "=cmd|' /C calc'!A0"),
      formula("eu_high", "@SUM(1)"),
      formula("kind", "+analog"),
      formula("name", "=cmd|' /C calc'!A0", "must"),
      formula("name", "'=1+2", "must"),
      formula("unit", "+1+1", "must"),
      formula("area", "@SUM(1)", "must"),
      formula("equipment", "-2+3", "must"),
    ].map((c) => (c.label === "a CSV body sent as JSON" ? { ...c, build: (s: Sample) => ({ ...c.build(s), contentType: "application/json" }) } : c)));

    // Bytes that are not UTF-8 (a Windows-1252 "°C"), and a file over the 20 MB limit.
    const latin1 = new TextEncoder().encode(`${CSV_HEADER}\n${row({ unit: "@@" })}\n`);
    const at = latin1.indexOf(0x40);
    latin1[at] = 0xb0;
    latin1[at + 1] = 0x43;
    await h.route(spec, [
      { category: "malformed CSV", label: "Windows-1252 bytes", build: (s) => ({ ...s, binaryBody: latin1.buffer.slice(0) as ArrayBuffer, contentType: "text/csv" }), field: /^line|^file$|^body$/ },
      { category: "malformed CSV", label: "a 21 MB file", build: (s) => ({ ...s, rawBody: `${CSV_HEADER}\n`.padEnd(21 * 1024 * 1024, "#"), contentType: "text/csv" }), field: /^file$|^body$/ },
    ]);
    const stored = await Tag.findAll({ where: { siteId: site.id }, attributes: ["name", "unit", "area", "equipment"], raw: true });
    // The apostrophe a spreadsheet export adds against formulas is removed; the text itself is kept.
    expect(stored.map((t) => t.name)).toEqual(expect.arrayContaining(["=cmd|' /C calc'!A0", "=1+2"]));
    expect(stored.map((t) => t.unit)).toContain("+1+1");
  }, SLOW);

  it("POST /api/sites/[site]/groups", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/groups",
      handler: createGroupRoute,
      user: engineer,
      sample: ROUTE_SAMPLES["POST /api/sites/[site]/groups"].bind(null, fx) as () => Promise<Sample>,
      readBack: async (_s, res) => {
        const g = await readGroup(fx.site.id, (res as { id: number }).id);
        return g && { ...g, selector: g.selector };
      },
    };
    await h.route(spec, [...bodyCases(), ...fieldCases(groupFields), ...paramCases(["site"])]);
    await h.fuzzRoute(spec, { seed: 205, runs: 40, paths: groupFields.map((f) => f.path) });
  }, SLOW);

  it("PATCH /api/sites/[site]/groups/[groupId]", async () => {
    const site = await createSite();
    const fresh = async (): Promise<Sample> => {
      const g = await createGroup(site);
      return { path: "/", params: { site: site.slug, groupId: String(g.id) }, body: groupBody() };
    };
    const spec: RouteSpec = {
      key: "PATCH /api/sites/[site]/groups/[groupId]",
      handler: patchGroupRoute,
      user: engineer,
      sample: fresh,
      readBack: async (s) => readGroup(site.id, Number(s.params!.groupId)),
      watch: async (s) => groupRows(Number(s.params!.groupId)),
    };
    await h.route(spec, [...bodyCases(), ...fieldCases(groupFields), ...paramCases(["groupId", "site"])]);
    await h.fuzzRoute(spec, { seed: 206, runs: 40, paths: groupFields.map((f) => f.path) });
  }, SLOW);

  it("DELETE /api/sites/[site]/groups/[groupId]", async () => {
    const spec: RouteSpec = { key: "DELETE /api/sites/[site]/groups/[groupId]", handler: deleteGroupRoute, user: engineer, sample: ROUTE_SAMPLES["DELETE /api/sites/[site]/groups/[groupId]"].bind(null, fx) as () => Promise<Sample> };
    await h.route(spec, paramCases(["groupId", "site"]));
  }, SLOW);

  it("PUT /api/sites/[site]/groups/order", async () => {
    const spec: RouteSpec = {
      key: "PUT /api/sites/[site]/groups/order",
      handler: orderRoute,
      user: engineer,
      sample: ROUTE_SAMPLES["PUT /api/sites/[site]/groups/order"].bind(null, fx) as () => Promise<Sample>,
    };
    await h.route(spec, [
      ...bodyCases(),
      { category: "missing field", label: "order", build: (s) => ({ ...s, body: {} }), field: "order" },
      ...fieldCases([{ path: ["order"], type: "list" }]),
      ...idListCases(["order"]),
      { category: "wrong type", label: "one group twice", build: (s) => ({ ...s, body: { order: [(s.body as { order: number[] }).order[0], (s.body as { order: number[] }).order[0]] } }), field: "order" },
      { category: "wrong type", label: "one group left out", build: (s) => ({ ...s, body: { order: [(s.body as { order: number[] }).order[0]] } }), field: "order" },
    ]);
    await h.fuzzRoute(spec, { seed: 207, runs: 30 });
  }, SLOW);

  it("POST /api/sites/[site]/groups/preview (writes nothing)", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/groups/preview",
      handler: previewRoute,
      user: engineer,
      sample: ROUTE_SAMPLES["POST /api/sites/[site]/groups/preview"].bind(null, fx) as () => Promise<Sample>,
      renew: false,
    };
    const selectorFields = groupFields.filter((f) => f.path[0] === "selector").map((f) => ({ ...f, noReadBack: true }));
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases(selectorFields),
      ...fieldCases([{ path: ["groupId"], type: "number", range: [1, Number.MAX_SAFE_INTEGER], int: true, nullable: true, noReadBack: true }]),
      ...paramCases(["site"]),
    ]);
    await h.fuzzRoute(spec, { seed: 208, runs: 30, paths: selectorFields.map((f) => f.path) });
  }, SLOW);

  it("POST /api/sites/[site]/draft/discard", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/draft/discard",
      handler: discardRoute,
      user: engineer,
      sample: ROUTE_SAMPLES["POST /api/sites/[site]/draft/discard"].bind(null, fx) as () => Promise<Sample>,
    };
    const put = (body: unknown) => (s: Sample) => ({ ...s, body });
    await h.route(spec, [
      ...bodyCases(),
      { category: "missing field", label: "neither all nor edits", build: put({}), field: "body" },
      { category: "wrong type", label: "all = false", build: put({ all: false }), field: /^body$|^all$/ },
      { category: "wrong type", label: 'all = "true"', build: put({ all: "true" }), field: /^body$|^all$/ },
      { category: "wrong type", label: "all = 1", build: put({ all: 1 }), field: /^body$|^all$/ },
      { category: "wrong type", label: "all and edits", build: put({ all: true, edits: ["x"] }), field: /^body$|^all$|^edits$/ },
      { category: "wrong type", label: "edits = []", build: put({ edits: [] }), field: /^body$|^edits/ },
      { category: "wrong type", label: 'edits = ""', build: put({ edits: "" }), field: /^body$|^edits/ },
      { category: "wrong type", label: "edits = [42]", build: put({ edits: [42] }), field: /^body$|^edits/ },
      { category: "wrong type", label: "an edit that is not in the draft", build: put({ edits: ["group-added:nowhere"] }), field: "edits" },
      { category: "10 MB string", label: "edits item", build: put({ edits: [TEN_MB] }), field: /^body$|^edits/ },
      { category: "huge number", label: "1,001 edits", build: put({ edits: Array.from({ length: 1001 }, (_, i) => `e${i}`) }), field: /^body$|^edits/ },
      ...(
        [
          ["path-like", "../../etc/passwd"],
          ["markup", "<script>alert(1)</script>"],
          ["formula", "=cmd|' /C calc'!A0"],
          ["control chars", "a\u0000b"],
          ["unicode", "👨‍👩‍👧‍👦"],
        ] as const
      ).map(([category, v]): Case => ({ category, label: `edits item ${JSON.stringify(v)}`, build: put({ edits: [v] }), field: "edits" })),
      { category: "lone surrogate", label: "edits item", build: (s) => ({ ...s, body: undefined, rawBody: '{"edits":["\\ud800"]}' }), field: "edits.0" },
      ...paramCases(["site"]),
    ]);
    await h.fuzzRoute(spec, { seed: 209, runs: 30 });
  }, SLOW);

  it("counts its cases", () => {
    const total = h.summary();
    expect(total).toBeGreaterThanOrEqual(MIN_CASES);
  });
});
