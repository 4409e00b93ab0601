import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as uploadRoute } from "@/app/api/sites/[site]/groups/[groupId]/samples/route";
import { DELETE as deleteSetRoute } from "@/app/api/sample-sets/[sampleSetId]/route";
import { GET as setDataRoute } from "@/app/api/sample-sets/[sampleSetId]/data/route";
import { GET as estimateRoute } from "@/app/api/sites/[site]/estimate/route";
import { GET as fleetEstimateRoute } from "@/app/api/estimates/route";
import { WIRE_MAGIC, decodeSeriesWire, encodeSeriesWire } from "@/lib/samples/wire";
import { SampleSet, type User } from "@/models";
import { createAssignment, createGateway, createGroup, createProfile, createSampleSet, createSite, createTag, createUser, ctx } from "../../factories";
import { AREAS, CONTROL_TEXT, Hostile, LINE_TEXT, ODD_TEXT, TEN_MB, legalText, paramCases, rowOf, send, type Case, type RouteSpec, type Sample } from "./harness";

// Hostile input against sample-set uploads (our binary wire format, lib/samples/wire.ts,
// with the tag context in the query) and sample-set deletion; then the estimates and the
// stored data for sets at the legal extremes.

const h = new Hostile("samples and estimates");
const MIN_CASES = 220;
const SLOW = 240_000;

let engineer: User;

const without = <T extends Record<string, string>>(o: T, key: keyof T) => Object.fromEntries(Object.entries(o).filter(([k]) => k !== key)) as Record<string, string>;

const wire = (t: number[], v: number[], q?: number[]) => encodeSeriesWire({ t: Float64Array.from(t), v: Float64Array.from(v), ...(q ? { q: Uint8Array.from(q) } : {}) });
const T0 = 1_790_000_000_000;
const ramp = (n: number, step = 1000, from = T0) => Array.from({ length: n }, (_, i) => from + i * step);

/** A raw header with any magic, version, count and flags, followed by `extra` bytes. */
function header(magic: number, version: number, n: number, flags: number, extra = 0): ArrayBuffer {
  const buf = new ArrayBuffer(16 + extra);
  const view = new DataView(buf);
  view.setUint32(0, magic, true);
  view.setUint32(4, version, true);
  view.setUint32(8, n, true);
  view.setUint32(12, flags, true);
  return buf;
}

describe("hostile input: sample sets and estimates", () => {
  let site: Awaited<ReturnType<typeof createSite>>;
  let groupId: number;
  let tagName: string;

  beforeAll(async () => {
    engineer = await createUser({ role: "engineer" });
    site = await createSite();
    const gw = await createGateway(site);
    tagName = (await createTag(site, gw, { name: "SMP/TT-1/PV" })).name;
    const group = await createGroup(site, { patterns: ["SMP/*/PV"] });
    groupId = group.id;
    await createAssignment(group, (await createProfile()).revision);
  });

  it("covers its share of the write routes", () => {
    expect(AREAS.samples).toHaveLength(2);
  });

  const path = (query: Record<string, string>) => `/api/sites/${site.slug}/groups/${groupId}/samples?${new URLSearchParams(query)}`;
  const spec = (): RouteSpec => ({
    key: "POST /api/sites/[site]/groups/[groupId]/samples",
    handler: uploadRoute,
    user: engineer,
    sample: async () => ({ path: path({ name: "hostile", tag: tagName }), params: { site: site.slug, groupId: String(groupId) }, binaryBody: wire(ramp(10), ramp(10).map((_, i) => i)) }),
    readBack: async (_s, res) => {
      const set = await SampleSet.findByPk((res as { id: number }).id);
      return set && { name: set.name, tag: set.tagName, unit: set.unit, samples: set.samples, euLow: set.euLow, euHigh: set.euHigh };
    },
    renew: false,
  });

  it("POST .../samples: the binary body", async () => {
    const body = (label: string, b: ArrayBuffer | (() => ArrayBuffer), accept: Case["accept"] = "never", category: Case["category"] = "binary", field: Case["field"] = "body"): Case => ({
      category,
      label,
      build: (s) => ({ ...s, binaryBody: typeof b === "function" ? b() : b }),
      accept,
      field: accept === "never" ? field : null,
    });
    await h.route(spec(), [
      body("no body", new ArrayBuffer(0)),
      body("15 bytes", new ArrayBuffer(15)),
      body("a header of zeros", new ArrayBuffer(16)),
      body("the magic backwards", header(0x534c5357, 1, 0, 0)),
      body("version 2", header(WIRE_MAGIC, 2, 2, 0, 32)),
      body("version 0xFFFFFFFF", header(WIRE_MAGIC, 0xffffffff, 2, 0, 32)),
      body("count 3, data for 2", header(WIRE_MAGIC, 1, 3, 0, 32)),
      body("count 2, data for 3", header(WIRE_MAGIC, 1, 2, 0, 48)),
      body("count 0xFFFFFFFF", header(WIRE_MAGIC, 1, 0xffffffff, 0, 32)),
      body("count 2**28 (the byte count wraps a 32-bit size)", header(WIRE_MAGIC, 1, 2 ** 28, 0, 0)),
      body("quality flag without quality bytes", header(WIRE_MAGIC, 1, 2, 1, 32)),
      body("unknown flag bits", () => {
        const b = wire([T0, T0 + 1000], [1, 2]);
        new DataView(b).setUint32(12, 0xfffffffe, true);
        return b;
      }, "may"),
      body("zero samples", wire([], [])),
      body("one sample", wire([T0], [1])),
      body("quality 3", wire([T0, T0 + 1000], [1, 2], [0, 3])),
      body("quality 255", wire([T0, T0 + 1000], [1, 2], [255, 0])),
      body("t NaN", wire([T0, NaN], [1, 2]), "never", "non-finite"),
      body("t Infinity", wire([T0, Infinity], [1, 2]), "never", "non-finite"),
      body("v NaN (good)", wire([T0, T0 + 1000], [NaN, 2]), "never", "non-finite"),
      body("v -Infinity (good)", wire([T0, T0 + 1000], [1, -Infinity]), "never", "non-finite"),
      body("v NaN on a bad sample", wire([T0, T0 + 1000, T0 + 2000], [1, NaN, 3], [0, 2, 0]), "may", "non-finite"),
      body("time going back", wire([T0, T0 - 1], [1, 2])),
      body("a repeated time", wire([T0, T0], [1, 2])),
      body("t before year 1000 (-1e15 ms)", wire([-1e15, -1e15 + 1000], [1, 2]), "never", "huge number"),
      body("t after year 9999 (2.6e14 ms)", wire([T0, 2.6e14], [1, 2]), "never", "huge number"),
      body("t 1e300", wire([T0, 1e300], [1, 2]), "never", "huge number"),
      body("t -1e308 … 1e308", wire([-1e308, 1e308], [1, 2]), "never", "huge number"),
      body("t 8.64e15 (the last Date)", wire([T0, 8.64e15], [1, 2]), "never", "huge number"),
      body("v ±1e308", wire(ramp(4), [1e308, -1e308, 1e308, -1e308]), "must", "huge number"),
      body("v 5e-324", wire(ramp(3), [5e-324, 0, -5e-324]), "must", "huge number"),
      body("t at the epoch", wire([0, 1, 2], [1, 2, 3]), "must", "huge number"),
      body("t spanning 1000-01-01 … 9999-12-31", wire([-30_610_224_000_000, 253_402_214_400_000], [1, 2]), "may", "huge number"),
      body("1,000,001 samples", () => wire(ramp(1_000_001, 1), new Array(1_000_001).fill(0)), "never", "huge number"),
      body("a 17 MB body", () => new ArrayBuffer(17_000_100), "never", "huge number"),
      body("JSON instead of binary", new TextEncoder().encode(JSON.stringify({ t: [1, 2], v: [1, 2] })).buffer as ArrayBuffer),
      body("CSV instead of binary", new TextEncoder().encode("t,v\n1,2\n3,4\n".padEnd(48, " ")).buffer as ArrayBuffer),
      body("a YAML bomb instead of binary", new TextEncoder().encode('a: &a ["x","x"]\nb: [*a,*a]\n').buffer as ArrayBuffer),
    ]);

    // fast-check: random bytes, and valid bodies with bytes overwritten.
    const s = spec();
    const good = new Uint8Array(wire(ramp(8), [1, 2, 3, 4, 5, 6, 7, 8]));
    const mutated = fc.tuple(fc.nat(good.length - 1), fc.uint8Array({ minLength: 1, maxLength: 16 })).map(([at, bytes]) => {
      const b = good.slice();
      b.set(bytes.slice(0, b.length - at), at);
      return b.buffer as ArrayBuffer;
    });
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.uint8Array({ maxLength: 200 }).map((b) => b.buffer as ArrayBuffer), mutated), async (bytes) => {
        const decoded = decodeSeriesWire(bytes);
        // A mutation that still decodes to a valid series may be stored; everything else is refused.
        await h.routeCase(s, await s.sample(), { category: "fast-check", label: `${bytes.byteLength} bytes`, build: (x) => ({ ...x, binaryBody: bytes }), accept: decoded.ok ? "may" : "never", field: decoded.ok ? null : "body" });
      }),
      { seed: 501, numRuns: 80 },
    );
  }, SLOW);

  it("POST .../samples: the query (name, tag and the tag context)", async () => {
    const q = (label: string, query: Record<string, string> | (() => Record<string, string>), accept: Case["accept"] = "never", field: Case["field"] = null, category: Case["category"] = "wrong type", stored?: Case["stored"]): Case => ({
      category,
      label,
      build: (s) => ({ ...s, path: path(typeof query === "function" ? query() : query) }),
      accept,
      field,
      stored,
    });
    const unknown = { tag: "NEW/TT-9/PV", kind: "analog", unit: "degC", samplePeriodMs: "1000", euLow: "0", euHigh: "100" };
    const names = [...ODD_TEXT, ...LINE_TEXT, ...CONTROL_TEXT].map((p) => {
      const legal = legalText("name", p.value, 120);
      return q(`name = ${JSON.stringify(p.value)}`, { name: p.value, tag: tagName }, legal ? "must" : "never", legal ? null : "name", p.category, legal ? { path: ["name"], value: p.value } : undefined);
    });
    await h.route(spec(), [
      q("no name", { tag: tagName }, "never", "name", "missing field"),
      q("no tag", { name: "x" }, "never", "tag", "missing field"),
      q("a blank name", { name: "   ", tag: tagName }, "never", "name"),
      q("a 121-character name", { name: "x".repeat(121), tag: tagName }, "never", "name"),
      q("a 10 MB name", { name: TEN_MB, tag: tagName }, "never", "name", "10 MB string"),
      q("a 192-character tag", { name: "x", tag: "T".repeat(192) }, "never", "tag"),
      ...names,
      {
        // A URL cannot carry a lone surrogate: its CESU-8 bytes decode to U+FFFD, which is text like any other.
        category: "lone surrogate",
        label: "name %ED%A0%80 (read as U+FFFD)",
        build: (s) => ({ ...s, path: `${path({ tag: tagName })}&name=%ED%A0%80` }),
        accept: "may",
        stored: { path: ["name"], value: new URLSearchParams("name=%ED%A0%80").get("name") },
      },
      q("a tag not in the inventory, no kind", { name: "x", tag: "NEW/TT-9/PV" }, "never", "kind"),
      q("… no unit", { ...without(unknown, "unit"), name: "x" }, "never", "unit"),
      q("… no sample period", { ...without(unknown, "samplePeriodMs"), name: "x" }, "never", "samplePeriodMs"),
      q("… kind ANALOG", { ...unknown, name: "x", kind: "ANALOG" }, "never", "kind"),
      q("… kind <script>", { ...unknown, name: "x", kind: "<script>alert(1)</script>" }, "never", "kind", "markup"),
      q("… unit NUL", { ...unknown, name: "x", unit: "deg\u0000C" }, "never", "unit", "control chars"),
      q("… unit 33 characters", { ...unknown, name: "x", unit: "u".repeat(33) }, "never", "unit"),
      q("… euLow NaN", { ...unknown, name: "x", euLow: "NaN" }, "never", "euLow", "non-finite"),
      q("… euHigh Infinity", { ...unknown, name: "x", euHigh: "Infinity" }, "never", "euHigh", "non-finite"),
      q("… euLow -1e309", { ...unknown, name: "x", euLow: "-1e309" }, "never", "euLow", "huge number"),
      q("… euLow empty", { ...unknown, name: "x", euLow: "" }, "never", /^euLow$|^euHigh$/),
      q("… euLow abc", { ...unknown, name: "x", euLow: "abc" }, "never", "euLow"),
      q("… low above high", { ...unknown, name: "x", euLow: "100", euHigh: "0" }, "never", /^euLow$|^euHigh$/),
      q("… only one end", { ...without(unknown, "euHigh"), name: "x" }, "never", /^euLow$|^euHigh$/),
      q("… period 0", { ...unknown, name: "x", samplePeriodMs: "0" }, "never", "samplePeriodMs"),
      q("… period empty", { ...unknown, name: "x", samplePeriodMs: "" }, "never", "samplePeriodMs"),
      q("… period 1.5", { ...unknown, name: "x", samplePeriodMs: "1.5" }, "never", "samplePeriodMs"),
      q("… period 1e308", { ...unknown, name: "x", samplePeriodMs: "1e308" }, "never", "samplePeriodMs", "huge number"),
      q("… period 2**53+1", { ...unknown, name: "x", samplePeriodMs: "9007199254740993" }, "never", "samplePeriodMs", "huge number"),
      q("… range ±1e308", { ...unknown, name: "x", euLow: "-1e308", euHigh: "1e308" }, "must", null, "huge number", { path: ["euHigh"], value: 1e308 }),
      q("… all given", { ...unknown, name: "x" }, "must", null, "wrong type", { path: ["tag"], value: "NEW/TT-9/PV" }),
    ]);
  }, SLOW);

  it("POST .../samples: the path", async () => {
    const cases: Case[] = paramCases(["site", "groupId"]);
    const other = await createGroup(await createSite());
    cases.push({ category: "path param", label: "a group of another site", build: (s) => ({ ...s, params: { ...s.params, groupId: String(other.id) } }), field: "group" });
    await h.route(spec(), cases);
  }, SLOW);

  it("DELETE /api/sample-sets/[sampleSetId]", async () => {
    const del: RouteSpec = {
      key: "DELETE /api/sample-sets/[sampleSetId]",
      handler: deleteSetRoute,
      user: engineer,
      sample: async () => ({ path: "/", params: { sampleSetId: String((await createSampleSet(site, (await createTag(site, await createGateway(site))))).id) } }),
      watch: async (s) => rowOf("sample_sets", Number(s.params!.sampleSetId)),
    };
    await h.route(del, paramCases(["sampleSetId"]));
  }, SLOW);

  it("answers the data and the estimates for sets at the legal extremes", async () => {
    // Every set accepted above lives in this site's group; the last-saved set is what the estimate measures.
    const extremes: [string, ArrayBuffer][] = [
      ["values ±1e308", wire(ramp(50), Array.from({ length: 50 }, (_, i) => (i % 2 ? 1e308 : -1e308)))],
      ["all samples bad", wire(ramp(50), new Array(50).fill(NaN), new Array(50).fill(2))],
      ["1 ms apart", wire(ramp(1000, 1), Array.from({ length: 1000 }, (_, i) => Math.sin(i)))],
      ["a year apart", wire(ramp(10, 31_557_600_000, 0), Array.from({ length: 10 }, (_, i) => i))],
      ["5e-324 values", wire(ramp(50), Array.from({ length: 50 }, (_, i) => (i % 3) * 5e-324))],
    ];
    for (const [label, bytes] of extremes) {
      let id: number | null = null;
      await h.action(`upload ${label}`, "stored data", async () => {
        const res = await uploadRoute(await send("POST", engineer, { path: path({ name: label, tag: tagName }), binaryBody: bytes }), ctx({ site: site.slug, groupId: String(groupId) }) as never);
        const json = await res.json();
        id = json.id ?? null;
        return res.status < 400 ? { ok: true, data: json } : { ok: false, status: res.status, ...json };
      }, { accept: "must" });
      if (id === null) continue;
      const reads: [string, () => Promise<Response>][] = [
        ["data", async () => setDataRoute(await send("GET", engineer, { path: "/" }), ctx({ sampleSetId: String(id) }) as never)],
        ["site estimate", async () => estimateRoute(await send("GET", engineer, { path: "/" }), ctx({ site: site.slug }) as never)],
        ["fleet estimate", async () => fleetEstimateRoute(await send("GET", engineer, { path: "/api/estimates" }), undefined as never)],
      ];
      for (const [what, call] of reads) {
        await h.action(`${label}: ${what}`, "stored data", async () => {
          const res = await call();
          if (what === "data" && res.status === 200) {
            const back = decodeSeriesWire(await res.arrayBuffer());
            expect.soft(back.ok && back.series.t.length, `${label}: the samples come back`).toBe(decodeSeriesWire(bytes).ok ? (decodeSeriesWire(bytes) as { series: { t: Float64Array } }).series.t.length : -1);
          }
          return res.status < 400 ? { ok: true } : { ok: false, status: res.status, ...(await res.json()) };
        }, { accept: "must" });
      }
    }
  }, SLOW);

  it("counts its cases", () => {
    const total = h.summary();
    expect(total).toBeGreaterThanOrEqual(MIN_CASES);
  });
});
