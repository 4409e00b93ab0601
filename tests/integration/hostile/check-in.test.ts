import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { PUT as checkInRoute } from "@/app/api/gateway/v1/check-in/route";
import { GatewayReport } from "@/models";
import { createUser } from "../../factories";
import { releasedGateway } from "../matrix/samples";
import { AREAS, CONTROL_TEXT, Hostile, bodyCases, fieldCases, rowOf, type Case, type Field, type RouteSpec, type Sample } from "./harness";

// Hostile input against the gateway check-in (PUT /api/gateway/v1/check-in, a bearer
// token, a JSON body of at most 256 KiB): the contract in DESIGN.md "Gateway API".

const h = new Hostile("gateway check-in");
const MIN_CASES = 250;
const SLOW = 180_000;

let g: Awaited<ReturnType<typeof releasedGateway>>;

const report = () => ({
  report: randomUUID(),
  release: g.release,
  digest: g.digest,
  status: "running",
  appliedAt: "2026-12-01T10:00:00Z",
  pointsIn: 6000,
  pointsOut: 400,
  from: "2026-12-01T10:00:00Z",
  to: "2026-12-01T10:01:00Z",
});

const fields: Field[] = [
  { path: ["report"], type: "text", required: true },
  { path: ["release"], type: "number", range: [1, 4_294_967_295], int: true, required: true },
  { path: ["digest"], type: "text", required: true },
  { path: ["status"], type: "enum", required: true },
  { path: ["appliedAt"], type: "text", required: true },
  { path: ["pointsIn"], type: "number", range: [0, Number.MAX_SAFE_INTEGER], int: true, required: true },
  { path: ["pointsOut"], type: "number", range: [0, Number.MAX_SAFE_INTEGER], int: true, required: true },
  { path: ["from"], type: "text", required: true },
  { path: ["to"], type: "text", required: true },
  { path: ["message"], type: "text", text: "text", max: 2000 },
  { path: ["unknownTags"], type: "list", items: "name", max: 255 },
];

describe("hostile input: gateway check-in", () => {
  let spec: RouteSpec;

  beforeAll(async () => {
    g = await releasedGateway();
    spec = {
      key: "PUT /api/gateway/v1/check-in",
      handler: checkInRoute as RouteSpec["handler"],
      user: await createUser(),
      sample: async (): Promise<Sample> => ({ path: "/api/gateway/v1/check-in", headers: { authorization: `Bearer ${g.token}` }, body: report() }),
      readBack: async (_s, _res, sent) => {
        const r = await GatewayReport.findOne({ where: { gatewayId: g.gatewayId, reportId: String((sent.body as { report: string }).report).toLowerCase() } });
        return r && { ...r.get({ plain: true }), unknownTags: r.unknownTags, message: r.message, pointsIn: r.pointsIn, pointsOut: r.pointsOut };
      },
      watch: async () => rowOf("gateways", g.gatewayId),
      fields,
    };
  });

  it("covers its share of the write routes", () => {
    expect(AREAS["check-in"]).toEqual(["PUT /api/gateway/v1/check-in"]);
  });

  it("refuses bad bodies, fields and values", async () => {
    // Control characters a gateway reports (a message, the names of tags it sees) are its own text:
    // refusing the whole report for them would lose its counters, so they may be stored as sent.
    const catalogue = fieldCases(fields).map((c): Case => {
      const field = c.label.split(" ")[0];
      if (c.category === "control chars" && (field === "message" || field === "unknownTags") && c.accept === "never") {
        const value = (c.build({ path: "/", body: {} }).body as Record<string, unknown>)[field];
        return { ...c, accept: "may", field: null, stored: { path: [field], value } };
      }
      // Any body over 256 KiB is refused before it is read: 413 naming the body.
      return c.category === "10 MB string" ? { ...c, field: "body" } : c;
    });
    const put = (patch: Record<string, unknown>) => (s: Sample) => ({ ...s, body: { ...(s.body as object), ...patch } });
    const time = (label: string, v: string, accept: Case["accept"] = "never", field: string = "appliedAt"): Case => ({ category: "wrong type", label: `${field} ${label}: ${v}`, build: put({ [field]: v }), accept, field: accept === "never" ? field : null });
    await h.route(spec, [
      ...bodyCases(),
      ...catalogue,
      { category: "wrong type", label: "an unknown key", build: put({ gateway: "another" }) },
      { category: "wrong type", label: "the report id in upper case (stored lower case)", build: (s) => ({ ...s, body: { ...(s.body as object), report: randomUUID().toUpperCase() } }), accept: "may" },
      { category: "wrong type", label: "a digest in upper case", build: put({ digest: g.digest.toUpperCase() }), field: "digest" },
      { category: "wrong type", label: "another release's digest", build: put({ digest: "0".repeat(64) }), field: "digest" },
      { category: "wrong type", label: "a release that does not exist", build: put({ release: g.release + 1 }), field: "release" },
      { category: "wrong type", label: "from after to", build: put({ from: "2026-12-01T10:02:00Z" }), field: "from" },
      { category: "huge number", label: "5,001 unknown tags", build: put({ unknownTags: Array.from({ length: 5001 }, (_, i) => `T${i}`) }), field: "unknownTags" },
      { category: "huge number", label: "a 256-character unknown tag", build: put({ unknownTags: ["x".repeat(256)] }), field: /^unknownTags/ },
      { category: "10 MB string", label: "a 10 MB body (the limit is 256 KiB)", build: put({ message: "x".repeat(10 * 1024 * 1024) }), field: "body" },
      time("without an offset", "2026-12-01T10:00:00"),
      time("as a date only", "2026-12-01"),
      time("as epoch ms", "1796119200000"),
      time("on 30 February", "2026-02-30T10:00:00Z"),
      time("in month 13", "2026-13-01T10:00:00Z"),
      time("at 24:00", "2026-12-01T24:00:00Z"),
      time("at offset +25:00", "2026-12-01T10:00:00+25:00"),
      time("in year 0001", "0001-01-01T00:00:00Z"),
      time("in year 0999", "0999-12-31T23:59:59Z"),
      time("in year 1000", "1000-01-01T00:00:00Z", "may"),
      time("in year 9999", "9999-12-31T23:59:59.999Z", "may"),
      time("in year +275760", "+275760-09-13T00:00:00Z"),
      time("in year 10000", "10000-01-01T00:00:00Z"),
      time("before 1970", "1969-12-31T23:59:59Z", "may"),
      time("with a leap second", "2016-12-31T23:59:60Z"),
      time("with nanoseconds", "2026-12-01T10:00:00.123456789Z", "may"),
      { category: "wrong type", label: "from in year 0001 (to before it too)", build: put({ from: "0001-01-01T00:00:00Z", to: "0001-01-01T00:01:00Z" }), field: /^from$|^to$/ },
      { category: "wrong type", label: "to in year 0999", build: put({ from: "0999-01-01T00:00:00Z", to: "0999-12-31T00:00:00Z" }), field: /^from$|^to$/ },
      { category: "not JSON", label: "JSON with a BOM", build: (s) => ({ ...s, body: undefined, rawBody: `\uFEFF${JSON.stringify(s.body)}` }), accept: "may" },
      { category: "not JSON", label: "two JSON documents", build: (s) => ({ ...s, body: undefined, rawBody: `${JSON.stringify(s.body)}${JSON.stringify(s.body)}` }), field: "body" },
      ...CONTROL_TEXT.map((p): Case => ({ category: "control chars", label: `report id with ${p.label}`, build: put({ report: `${randomUUID()}${p.value}` }), field: "report" })),
    ]);
    await h.fuzzRoute(spec, { seed: 601, runs: 60 });
  }, SLOW);

  it("records what was accepted exactly once", async () => {
    const body = report();
    const send = async () => checkInRoute(new Request("http://127.0.0.1/api/gateway/v1/check-in", { method: "PUT", headers: { authorization: `Bearer ${g.token}`, "content-type": "application/json" }, body: JSON.stringify(body) }), undefined);
    expect((await send()).status).toBe(204);
    expect((await send()).status).toBe(204);
    expect(await GatewayReport.count({ where: { gatewayId: g.gatewayId, reportId: body.report } })).toBe(1);
  });

  it("counts its cases", () => {
    const total = h.summary();
    expect(total).toBeGreaterThanOrEqual(MIN_CASES);
  });
});
