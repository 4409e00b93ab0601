import { beforeAll, describe, expect, it } from "vitest";
import { DELETE as removeAssignmentRoute, PUT as setAssignmentRoute } from "@/app/api/sites/[site]/groups/[groupId]/assignment/route";
import { POST as submitRoute } from "@/app/api/sites/[site]/changes/route";
import { POST as approveRoute } from "@/app/api/sites/[site]/changes/[changeId]/approve/route";
import { POST as rejectRoute } from "@/app/api/sites/[site]/changes/[changeId]/reject/route";
import { POST as releaseRoute } from "@/app/api/sites/[site]/changes/[changeId]/release/route";
import { POST as rollbackRoute } from "@/app/api/sites/[site]/rollbacks/route";
import { POST as urgentRoute } from "@/app/api/sites/[site]/rollbacks/urgent/route";
import { GET as estimateRoute } from "@/app/api/sites/[site]/estimate/route";
import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";
import type { Profile } from "@/lib/reduction/profile";
import { packSeries } from "@/lib/samples/storage";
import { Assignment, Change, ProfileRevision, SampleSet, type User } from "@/models";
import { createGateway, createGroup, createProfile, createSite, createTag, createUser, ctx } from "../../factories";
import { ROUTE_SAMPLES, makeFixture, type Fixture } from "../matrix/samples";
import { AREAS, Hostile, bodyCases, fieldCases, paramCases, rowOf, send, type Case, type Field, type RouteSpec, type Sample } from "./harness";

// Hostile input against assignments, the change workflow (submit, approve, reject,
// release) and rollbacks; then legal extremes stored in a profile carried through the
// whole workflow (assign, submit with review and impact, approve, release, estimate).

const h = new Hostile("assignments, changes, releases, rollbacks");
const MIN_CASES = 700;
const SLOW = 240_000;

let engineer: User;
let admin: User;
let reviewer: User;
let fx: Fixture;

const sample = (key: string) => () => ROUTE_SAMPLES[key](fx) as Promise<Sample>;
const changeRow = async (s: Sample) => rowOf("changes", Number(s.params!.changeId));

describe("hostile input: assignments, changes, releases and rollbacks", () => {
  beforeAll(async () => {
    engineer = await createUser({ role: "engineer" });
    admin = await createUser({ role: "admin" });
    reviewer = await createUser({ role: "reviewer" });
    fx = await makeFixture();
  });

  it("covers its share of the write routes", () => {
    expect(AREAS.changes).toHaveLength(8);
  });

  it("PUT /api/sites/[site]/groups/[groupId]/assignment", async () => {
    const override = { output: "shape", step: 1, parameter: "deviation", value: { value: 0.3, unit: "degC" } };
    const fresh = async (): Promise<Sample> => {
      const s = await ROUTE_SAMPLES["PUT /api/sites/[site]/groups/[groupId]/assignment"](fx);
      return { ...s, body: { ...(s.body as object), overrides: [override] } } as Sample;
    };
    const fields: Field[] = [
      { path: ["profileId"], type: "number", range: [1, Number.MAX_SAFE_INTEGER], int: true, required: true },
      { path: ["revision"], type: "number", range: [1, Number.MAX_SAFE_INTEGER], int: true, required: true },
      { path: ["overrides"], type: "list" },
      { path: ["overrides", 0, "output"], type: "text", required: true, reportedAs: /^overrides(\.0|\[0\])/ },
      { path: ["overrides", 0, "step"], type: "number", range: [0, Number.MAX_SAFE_INTEGER], int: true, required: true, reportedAs: /^overrides(\.0|\[0\])/ },
      { path: ["overrides", 0, "parameter"], type: "text", required: true, reportedAs: /^overrides(\.0|\[0\])/ },
      { path: ["overrides", 0, "value"], type: "text", required: true, reportedAs: /^overrides(\.0|\[0\])/ },
      { path: ["overrides", 0, "value", "value"], type: "number", range: [0, Number.MAX_VALUE], required: true, reportedAs: /^overrides(\.0|\[0\])/ },
      { path: ["overrides", 0, "value", "unit"], type: "text", text: "name", max: 32, required: true, mayRefuse: true, reportedAs: /^overrides(\.0|\[0\])/ },
      { path: ["tagOverrides"], type: "list" },
    ];
    const spec: RouteSpec = {
      key: "PUT /api/sites/[site]/groups/[groupId]/assignment",
      handler: setAssignmentRoute,
      user: engineer,
      sample: fresh,
      fields,
      readBack: async (s) => {
        const a = await Assignment.findOne({ where: { groupId: Number(s.params!.groupId) } });
        const rev = a && (await ProfileRevision.findByPk(a.profileRevisionId));
        return a && { profileId: rev!.profileId, revision: rev!.number, overrides: a.overrides };
      },
      watch: async (s) => Assignment.findOne({ where: { groupId: Number(s.params!.groupId) }, raw: true }),
    };
    const put = (body: (b: Record<string, unknown>) => unknown) => (s: Sample) => ({ ...s, body: body(s.body as Record<string, unknown>) });
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases(fields),
      { category: "wrong type", label: "an unknown key", build: put((b) => ({ ...b, profile: "x" })) },
      { category: "wrong type", label: "an override of a step that does not exist", build: put((b) => ({ ...b, overrides: [{ ...override, step: 99 }] })), field: /^overrides(\.0|\[0\])/ },
      { category: "wrong type", label: "an override of a parameter the step lacks", build: put((b) => ({ ...b, overrides: [{ ...override, parameter: "__proto__" }] })), field: /^overrides(\.0|\[0\])/ },
      { category: "huge number", label: "65 overrides", build: put((b) => ({ ...b, overrides: Array(65).fill(override) })), field: "overrides" },
      { category: "wrong type", label: "a tag override for a tag not in the group", build: put((b) => ({ ...b, tagOverrides: [{ tag: "NOT/IN/GROUP", overrides: [override] }] })), field: /^tagOverrides(\.0|\[0\])/ },
      { category: "wrong type", label: "a tag override without overrides", build: put((b) => ({ ...b, tagOverrides: [{ tag: "A", overrides: [] }] })), field: /^tagOverrides(\.0|\[0\])/ },
      { category: "wrong type", label: "the same tag twice", build: put((b) => ({ ...b, tagOverrides: [0, 1].map(() => ({ tag: "A", overrides: [override] })) })), field: /^tagOverrides/ },
      { category: "path-like", label: "a tag override for ../../etc/passwd", build: put((b) => ({ ...b, tagOverrides: [{ tag: "../../etc/passwd", overrides: [override] }] })), field: /^tagOverrides(\.0|\[0\])/ },
      { category: "10 MB string", label: "acknowledge", build: put((b) => ({ ...b, acknowledge: "x".repeat(10 * 1024 * 1024) })), field: "acknowledge" },
      { category: "wrong type", label: "a profile that does not exist", build: put((b) => ({ ...b, profileId: 2 ** 31 })), field: "profileId" },
      { category: "wrong type", label: "a revision that does not exist", build: put((b) => ({ ...b, revision: 2 ** 31 })), field: "revision" },
      ...paramCases(["groupId", "site"]),
    ]);
    await h.fuzzRoute(spec, { seed: 401, runs: 40, paths: fields.map((f) => f.path) });
  }, SLOW);

  it("PUT .../assignment on a regulated group: the caution acknowledgement", async () => {
    const site = await createSite();
    const gw = await createGateway(site);
    await createTag(site, gw, { name: "REG/TT-1/PV" });
    const { profile } = await createProfile();
    const fresh = async (): Promise<Sample> => {
      const g = await createGroup(site, { patterns: ["REG/*/PV"], name: `reg-${Math.random().toString(36).slice(2, 8)}` });
      await g.update({ regulated: true });
      return { path: "/", params: { site: site.slug, groupId: String(g.id) }, body: { profileId: profile.id, revision: 1 } };
    };
    const spec: RouteSpec = { key: "PUT /api/sites/[site]/groups/[groupId]/assignment", handler: setAssignmentRoute, user: engineer, sample: fresh };
    const ack = (v: unknown): Case => ({ category: typeof v === "string" && v.length > 1000 ? "10 MB string" : "wrong type", label: `acknowledge = ${JSON.stringify(v)?.slice(0, 40)}`, build: (s) => ({ ...s, body: { ...(s.body as object), acknowledge: v } }), field: "acknowledge" });
    await h.route(spec, [
      { category: "missing field", label: "acknowledge", build: (s) => s, field: "acknowledge" },
      ...[42, true, null, [], {}, "", "yes", REGULATED_RECORD_CAUTION.id.toUpperCase(), `${REGULATED_RECORD_CAUTION.id} `, "<script>alert(1)</script>", "a\u0000b", "x".repeat(65), "x".repeat(10 * 1024 * 1024)].map(ack),
      { category: "lone surrogate", label: "acknowledge", build: (s) => ({ ...s, body: undefined, rawBody: JSON.stringify(s.body).replace(/}$/, ',"acknowledge":"\\ud800"}') }), field: "acknowledge" },
      { category: "wrong type", label: "the right acknowledgement", build: (s) => ({ ...s, body: { ...(s.body as object), acknowledge: REGULATED_RECORD_CAUTION.id } }), accept: "must" },
    ]);
  }, SLOW);

  it("DELETE /api/sites/[site]/groups/[groupId]/assignment", async () => {
    const spec: RouteSpec = { key: "DELETE /api/sites/[site]/groups/[groupId]/assignment", handler: removeAssignmentRoute, user: engineer, sample: sample("DELETE /api/sites/[site]/groups/[groupId]/assignment") };
    const bare = async (): Promise<Sample> => ({ path: "/", params: { site: fx.site.slug, groupId: String((await createGroup(fx.site)).id) } });
    await h.route(spec, paramCases(["groupId", "site"]));
    await h.route({ ...spec, sample: bare }, [{ category: "path param", label: "a group without an assignment", build: (s) => s, field: "group" }]);
  }, SLOW);

  it("POST /api/sites/[site]/changes (submit)", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/changes",
      handler: submitRoute,
      user: engineer,
      sample: sample("POST /api/sites/[site]/changes"),
      readBack: async (_s, res) => Change.findByPk((res as { changeId: number }).changeId, { raw: true }).then((c) => c && { note: c.note }),
    };
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases([{ path: ["note"], type: "text", text: "text", max: 1000 }]),
      { category: "wrong type", label: "an unknown key", build: (s) => ({ ...s, body: { note: "x", state: "approved" } }) },
      ...paramCases(["site"]),
    ]);
    await h.fuzzRoute(spec, { seed: 402, runs: 25 });
  }, SLOW);

  it("POST /api/sites/[site]/changes/[changeId]/approve", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/changes/[changeId]/approve",
      handler: approveRoute,
      user: reviewer,
      sample: sample("POST /api/sites/[site]/changes/[changeId]/approve"),
      readBack: async (s) => Change.findByPk(Number(s.params!.changeId), { raw: true }).then((c) => c && { comment: c.reviewComment }),
      watch: changeRow,
    };
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases([{ path: ["comment"], type: "text", text: "text", max: 2000 }]),
      { category: "wrong type", label: "an unknown key", build: (s) => ({ ...s, body: { comment: "ok", state: "released" } }) },
      { category: "wrong type", label: "acknowledge = 42", build: (s) => ({ ...s, body: { acknowledge: 42 } }), field: "acknowledge" },
      { category: "10 MB string", label: "acknowledge", build: (s) => ({ ...s, body: { acknowledge: "x".repeat(10 * 1024 * 1024) } }), field: "acknowledge" },
      ...paramCases(["changeId", "site"]),
    ]);
    await h.fuzzRoute(spec, { seed: 403, runs: 25 });
  }, SLOW);

  it("POST /api/sites/[site]/changes/[changeId]/reject", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/changes/[changeId]/reject",
      handler: rejectRoute,
      user: reviewer,
      sample: sample("POST /api/sites/[site]/changes/[changeId]/reject"),
      readBack: async (s) => Change.findByPk(Number(s.params!.changeId), { raw: true }).then((c) => c && { comment: c.reviewComment }),
      watch: changeRow,
    };
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases([{ path: ["comment"], type: "text", text: "text", max: 2000, required: true }]),
      { category: "wrong type", label: "a blank comment", build: (s) => ({ ...s, body: { comment: " \t " } }), field: "comment" },
      ...paramCases(["changeId", "site"]),
    ]);
    await h.fuzzRoute(spec, { seed: 404, runs: 25 });
  }, SLOW);

  it("POST /api/sites/[site]/changes/[changeId]/release", async () => {
    const spec: RouteSpec = { key: "POST /api/sites/[site]/changes/[changeId]/release", handler: releaseRoute, user: reviewer, sample: sample("POST /api/sites/[site]/changes/[changeId]/release"), watch: changeRow };
    await h.route(spec, paramCases(["changeId", "site"]));
  }, SLOW);

  it("POST /api/sites/[site]/rollbacks", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/rollbacks",
      handler: rollbackRoute,
      user: reviewer,
      sample: sample("POST /api/sites/[site]/rollbacks"),
      readBack: async (_s, res) => Change.findByPk((res as { changeId: number }).changeId, { raw: true }).then((c) => c && { note: c.note, release: c.rollbackOf }),
    };
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases([
        { path: ["release"], type: "number", range: [1, 1], int: true, required: true },
        { path: ["note"], type: "text", text: "text", max: 1000 },
      ]),
      { category: "wrong type", label: "the current release", build: (s) => ({ ...s, body: { release: 2 } }), field: "release" },
      { category: "huge number", label: "a release that does not exist", build: (s) => ({ ...s, body: { release: 2 ** 31 } }), field: "release" },
      ...paramCases(["site"]),
    ]);
    await h.fuzzRoute(spec, { seed: 405, runs: 20 });
  }, SLOW);

  it("POST /api/sites/[site]/rollbacks/urgent", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/rollbacks/urgent",
      handler: urgentRoute,
      user: reviewer,
      sample: sample("POST /api/sites/[site]/rollbacks/urgent"),
      readBack: async (_s, res) => Change.findByPk((res as { changeId: number }).changeId, { raw: true }).then((c) => c && { reason: c.note, release: c.rollbackOf }),
    };
    await h.route(spec, [
      ...bodyCases(),
      ...fieldCases([
        { path: ["release"], type: "number", range: [1, 1], int: true, required: true },
        // At least 10 characters: the catalogue's shorter texts are refused for length, not content.
        { path: ["reason"], type: "text", text: "text", max: 1000, required: true, affix: " — the line is down" },
      ]),
      { category: "wrong type", label: "a 9-character reason", build: (s) => ({ ...s, body: { release: 1, reason: "too short" } }), field: "reason" },
      ...paramCases(["site"]),
    ]);
    await h.fuzzRoute(spec, { seed: 406, runs: 20 });
  }, SLOW);

  it("carries legal extremes stored in a profile through assignment, review, release and estimates", async () => {
    // Values every schema allows, at the far end: the workflow must answer 2xx or a 4xx naming the problem, never 500.
    const extremes: { label: string; steps: Profile["outputs"][number]["steps"] }[] = [
      { label: "swinging door 1e308 with a 1e308 s max interval", steps: [{ method: "swinging-door", deviation: { value: 1e308, unit: "degC" }, "max-interval": 1e308 }] },
      { label: "deadband of 5e-324 % of range", steps: [{ method: "deadband", deadband: { percent: 5e-324 } }] },
      { label: "a mean over a 1e308 s window", steps: [{ method: "aggregate", fn: "mean", window: 1e308 }] },
      { label: "a 95th percentile over 5e-324 s windows", steps: [{ method: "aggregate", fn: "percentile", percentile: 95, window: 5e-324 }] },
      { label: "LTTB to 2**53-1 points", steps: [{ method: "lttb", points: Number.MAX_SAFE_INTEGER }] },
      { label: "exceedances of -1e308 per 1e-300 s", steps: [{ method: "exceedance-count", window: 1e-300, threshold: { value: -1e308, unit: "degC" } }] },
      { label: "M4 with a -1e308 s offset", steps: [{ method: "m4", window: 60, offset: -1e308 }] },
      { label: "RDP epsilon 0", steps: [{ method: "rdp", epsilon: { value: 0, unit: "degC" } }] },
    ];
    for (const x of extremes) {
      const site = await createSite();
      const gw = await createGateway(site);
      await createTag(site, gw, { name: "EXT/TT-1/PV" });
      const group = await createGroup(site, { patterns: ["EXT/*/PV"] });
      const { profile } = await createProfile({ outputs: [{ name: "x", steps: x.steps }] });
      // A saved sample set for the group, so the review measures the impact.
      const t = Float64Array.from({ length: 200 }, (_, i) => 1_790_000_000_000 + i * 1000);
      const v = Float64Array.from({ length: 200 }, (_, i) => (i % 7) * 10);
      const packed = packSeries({ t, v });
      await SampleSet.create({ siteId: site.id, groupId: group.id, name: "ext", tagName: "EXT/TT-1/PV", kind: "analog", unit: "degC", euLow: 0, euHigh: 150, samplePeriodMs: 1000, samples: 200, firstAt: new Date(t[0]), lastAt: new Date(t[199]), encoding: packed.encoding, data: packed.data, byteSize: packed.data.length, createdBy: null });
      const call = async (label: string, user: User, handler: (r: Request, c: never) => Promise<Response>, method: string, params: Record<string, string>, body?: unknown) => {
        let answer: unknown = null;
        await h.action(`${x.label}: ${label}`, "stored data", async () => {
          const res = await handler(await send(method, user, { path: "/", body }), ctx(params) as never);
          const text = await res.text();
          answer = text ? JSON.parse(text) : null;
          return res.status < 400 ? { ok: true, data: answer } : { ok: false, status: res.status, ...(answer as object) };
        }, { accept: "may" });
        return answer as Record<string, unknown> | null;
      };
      const assigned = await call("assign", engineer, setAssignmentRoute, "PUT", { site: site.slug, groupId: String(group.id) }, { profileId: profile.id, revision: 1 });
      if (!assigned || "error" in assigned) continue;
      await call("estimate", engineer, estimateRoute as never, "GET", { site: site.slug });
      const submitted = await call("submit", engineer, submitRoute, "POST", { site: site.slug }, { note: x.label });
      if (!submitted || "error" in submitted) continue;
      const changeId = String(submitted.changeId);
      const approved = await call("approve", admin, approveRoute, "POST", { site: site.slug, changeId }, {});
      if (!approved || "error" in approved) continue;
      await call("release", admin, releaseRoute, "POST", { site: site.slug, changeId });
      await call("estimate after release", engineer, estimateRoute as never, "GET", { site: site.slug });
    }
  }, SLOW);

  it("counts its cases", () => {
    const total = h.summary();
    expect(total).toBeGreaterThanOrEqual(MIN_CASES);
  });
});
