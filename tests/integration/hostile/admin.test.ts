import { QueryTypes } from "sequelize";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as createUserRoute } from "@/app/api/users/route";
import { PATCH as patchUserRoute } from "@/app/api/users/[id]/route";
import { POST as resetPasswordRoute } from "@/app/api/users/[id]/password/route";
import { POST as createSiteRoute } from "@/app/api/sites/route";
import { DELETE as deleteSiteRoute, PATCH as patchSiteRoute } from "@/app/api/sites/[site]/route";
import { POST as createGatewayRoute } from "@/app/api/sites/[site]/gateways/route";
import { DELETE as deleteGatewayRoute, PATCH as patchGatewayRoute } from "@/app/api/sites/[site]/gateways/[gateway]/route";
import { POST as issueTokenRoute } from "@/app/api/sites/[site]/gateways/[gateway]/tokens/route";
import { DELETE as revokeTokenRoute } from "@/app/api/sites/[site]/gateways/[gateway]/tokens/[tokenId]/route";
import { presentGateway, presentSite } from "@/lib/data/sites";
import { Gateway, GatewayToken, Site, User, sequelize } from "@/models";
import { createGateway, createGatewayToken, createUser } from "../../factories";
import { ROUTE_SAMPLES, gatewayBody, makeFixture, siteBody, type Fixture } from "../matrix/samples";
import { AREAS, Hostile, bodyCases, fieldCases, paramCases, rowOf, send, writeRoutes, type Case, type Field, type RouteSpec, type Sample } from "./harness";

// Hostile input against the admin routes: users, sites, gateways and gateway tokens.

const h = new Hostile("admin (users, sites, gateways, tokens)");
const MIN_CASES = 600;
const SLOW = 120_000;

let admin: User;
let before: User[];
let fx: Fixture;

const siteFields: Field[] = [
  { path: ["name"], type: "text", text: "name", max: 120, required: true },
  { path: ["slug"], type: "text", required: true },
  { path: ["timeZone"], type: "text", required: true },
  { path: ["uplinkBudgetKbps"], type: "number", range: [0.001, 999_999_999], decimals: 3, required: true },
  { path: ["storagePricePerGbMonth"], type: "number", range: [0, 1e6], decimals: 4, required: true },
  { path: ["retentionMonths"], type: "number", range: [1, 1200], int: true, required: true },
  { path: ["defaultHandling"], type: "enum", required: true },
  { path: ["bytesPerSample"], type: "number", range: [1, 256], int: true },
  { path: ["transportOverheadPct"], type: "number", range: [0, 200], decimals: 2 },
  { path: ["uplinkHeadroomPct"], type: "number", range: [0, 90], decimals: 2 },
];

const gatewayFields: Field[] = [
  { path: ["name"], type: "text", text: "name", max: 120, required: true },
  { path: ["slug"], type: "text", required: true },
  { path: ["description"], type: "text", text: "text", max: 500 },
  { path: ["pollSeconds"], type: "number", range: [5, 86_400], int: true, required: true },
];

const siteBySlugRow = async (slug: string) =>
  (await sequelize.query<Record<string, unknown>>("SELECT * FROM sites WHERE slug = ?", { replacements: [slug], type: QueryTypes.SELECT }))[0] ?? null;

const readSite = async (slug: string) => {
  const site = await Site.findOne({ where: { slug } });
  return site ? presentSite(site) : null;
};

const sample = (key: string) => () => ROUTE_SAMPLES[key](fx) as Promise<Sample>;

describe("hostile input: admin routes", () => {
  beforeAll(async () => {
    admin = await createUser({ role: "admin" });
    fx = await makeFixture();
    // The accounts that were there before (the demo administrator among them) must come out untouched.
    before = await User.findAll({ attributes: ["id", "email", "name", "role", "active", "passwordHash"], order: [["id", "ASC"]], raw: true });
  });

  it("covers every write route of the permissions table across the hostile files", () => {
    expect(Object.values(AREAS).flat().sort()).toEqual(writeRoutes());
  });

  it("POST /api/users", async () => {
    const spec: RouteSpec = {
      key: "POST /api/users",
      handler: createUserRoute,
      user: admin,
      sample: sample("POST /api/users"),
      readBack: async (s) => (await User.findOne({ where: { email: (s.body as { email: string }).email } }))?.get({ plain: true }),
    };
    const fields: Field[] = [
      { path: ["email"], type: "text", required: true },
      { path: ["name"], type: "text", text: "name", max: 120, required: true },
      { path: ["role"], type: "enum", required: true },
    ];
    await h.route(spec, [...bodyCases(), ...fieldCases(fields)]);
    await h.fuzzRoute(spec, { seed: 101, runs: 30 });
  }, SLOW);

  it("PATCH /api/users/[id]", async () => {
    const spec: RouteSpec = {
      key: "PATCH /api/users/[id]",
      handler: patchUserRoute,
      user: admin,
      sample: sample("PATCH /api/users/[id]"),
      readBack: async (s) => (await User.findByPk(Number(s.params!.id)))?.get({ plain: true }),
      watch: async (s) => rowOf("users", Number(s.params!.id)),
    };
    const fields: Field[] = [
      { path: ["name"], type: "text", text: "name", max: 120 },
      { path: ["role"], type: "enum" },
      { path: ["active"], type: "boolean" },
    ];
    await h.route(spec, [
      ...bodyCases(),
      { category: "wrong type", label: "an unknown key", build: (s) => ({ ...s, body: { ...(s.body as object), isAdmin: true } }) },
      { category: "missing field", label: "an empty patch", build: (s) => ({ ...s, body: {} }), field: "body" },
      ...fieldCases(fields),
      ...paramCases(["id"]),
    ]);
    await h.fuzzRoute(spec, { seed: 102, runs: 30, paths: [["name"], ["role"], ["active"]] });
  }, SLOW);

  it("POST /api/users/[id]/password", async () => {
    const spec: RouteSpec = {
      key: "POST /api/users/[id]/password",
      handler: resetPasswordRoute,
      user: admin,
      sample: sample("POST /api/users/[id]/password"),
      watch: async (s) => rowOf("users", Number(s.params!.id)),
    };
    await h.route(spec, paramCases(["id"]));
  }, SLOW);

  it("POST /api/sites", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites",
      handler: createSiteRoute,
      user: admin,
      sample: sample("POST /api/sites"),
      fields: siteFields,
      readBack: async (s) => readSite((s.body as { slug: string }).slug),
    };
    await h.route(spec, [...bodyCases(), ...fieldCases(siteFields)]);
    await h.fuzzRoute(spec, { seed: 103, runs: 40 });
  }, SLOW);

  it("PATCH /api/sites/[site]", async () => {
    const spec: RouteSpec = {
      key: "PATCH /api/sites/[site]",
      handler: patchSiteRoute,
      user: admin,
      sample: sample("PATCH /api/sites/[site]"),
      fields: siteFields,
      // By id: a legal slug in the body renames the site.
      readBack: async (_s, res) => presentSite((await Site.findByPk((res as { id: number }).id))!),
      watch: async (s) => siteBySlugRow(s.params!.site),
    };
    await h.route(spec, [...bodyCases(), ...fieldCases(siteFields), ...paramCases(["site"])]);
    await h.fuzzRoute(spec, { seed: 104, runs: 40 });
  }, SLOW);

  it("DELETE /api/sites/[site]", async () => {
    const spec: RouteSpec = { key: "DELETE /api/sites/[site]", handler: deleteSiteRoute, user: admin, sample: sample("DELETE /api/sites/[site]") };
    await h.route(spec, paramCases(["site"]));
  }, SLOW);

  it("POST /api/sites/[site]/gateways", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/gateways",
      handler: createGatewayRoute,
      user: admin,
      sample: sample("POST /api/sites/[site]/gateways"),
      readBack: async (s) => {
        const gw = await Gateway.findOne({ where: { slug: (s.body as { slug: string }).slug } });
        return gw ? presentGateway(gw) : null;
      },
    };
    await h.route(spec, [...bodyCases(), ...fieldCases(gatewayFields), ...paramCases(["site"])]);
    await h.fuzzRoute(spec, { seed: 105, runs: 30 });
  }, SLOW);

  it("PATCH /api/sites/[site]/gateways/[gateway]", async () => {
    // A gateway of its own for each sample, so accepted cases do not pile onto the fixture's.
    const fresh = async (): Promise<Sample> => {
      const gw = await createGateway(fx.site);
      return { path: "/", params: { site: fx.site.slug, gateway: gw.slug }, body: { ...gatewayBody(), slug: gw.slug } };
    };
    const spec: RouteSpec = {
      key: "PATCH /api/sites/[site]/gateways/[gateway]",
      handler: patchGatewayRoute,
      user: admin,
      sample: fresh,
      readBack: async (_s, res) => presentGateway((await Gateway.findByPk((res as { id: number }).id))!),
      watch: async (s) => (await Gateway.findOne({ where: { slug: s.params!.gateway }, raw: true })) ?? null,
    };
    await h.route(spec, [...bodyCases(), ...fieldCases(gatewayFields), ...paramCases(["site", "gateway"])]);
    await h.fuzzRoute(spec, { seed: 106, runs: 30 });
  }, SLOW);

  it("DELETE /api/sites/[site]/gateways/[gateway]", async () => {
    const spec: RouteSpec = { key: "DELETE /api/sites/[site]/gateways/[gateway]", handler: deleteGatewayRoute, user: admin, sample: sample("DELETE /api/sites/[site]/gateways/[gateway]") };
    await h.route(spec, paramCases(["site", "gateway"]));
  }, SLOW);

  it("POST /api/sites/[site]/gateways/[gateway]/tokens", async () => {
    const spec: RouteSpec = {
      key: "POST /api/sites/[site]/gateways/[gateway]/tokens",
      handler: issueTokenRoute,
      user: admin,
      sample: sample("POST /api/sites/[site]/gateways/[gateway]/tokens"),
      readBack: async (_s, res) => (await GatewayToken.findByPk((res as { id: number }).id))?.get({ plain: true }),
      renew: false,
    };
    // The body is optional ({label?}); JSON null stands for no body, as the CLI and the action pass it.
    const roots = bodyCases().map((c) => (c.label === "null" ? { ...c, accept: "may" as const } : c));
    await h.route(spec, [
      ...roots,
      { category: "wrong type", label: "an unknown key", build: (s) => ({ ...s, body: { label: "x", scope: "all" } }) },
      ...fieldCases([
        { path: ["label"], type: "text", text: "name", max: 120 },
        { path: ["expiresInDays"], type: "number", range: [1, 3650], int: true, nullable: true, noReadBack: true },
      ]),
      ...paramCases(["site", "gateway"]),
    ]);
    await h.fuzzRoute(spec, { seed: 107, runs: 30 });
  }, SLOW);

  it("DELETE /api/sites/[site]/gateways/[gateway]/tokens/[tokenId]", async () => {
    const spec: RouteSpec = {
      key: "DELETE /api/sites/[site]/gateways/[gateway]/tokens/[tokenId]",
      handler: revokeTokenRoute,
      user: admin,
      sample: sample("DELETE /api/sites/[site]/gateways/[gateway]/tokens/[tokenId]"),
      watch: async (s) => rowOf("gateway_tokens", Number(s.params!.tokenId)),
    };
    await h.route(spec, paramCases(["tokenId", "gateway", "site"]));
  }, SLOW);

  it("answers the site estimate for sites stored at the edges of their ranges", async () => {
    // Stored data at the legal extremes must not break what is computed from it.
    const { GET: estimateRoute } = await import("@/app/api/sites/[site]/estimate/route");
    const edges = [
      { uplinkBudgetKbps: 0.001, storagePricePerGbMonth: 0, retentionMonths: 1, bytesPerSample: 1, transportOverheadPct: 0, uplinkHeadroomPct: 90 },
      { uplinkBudgetKbps: 999_999_999, storagePricePerGbMonth: 1e6, retentionMonths: 1200, bytesPerSample: 256, transportOverheadPct: 200, uplinkHeadroomPct: 0 },
    ];
    for (const edge of edges) {
      const body = { ...siteBody(), ...edge };
      const created = await h.action(`POST /api/sites at ${JSON.stringify(edge)}`, "stored data", async () => {
        const res = await createSiteRoute(await send("POST", admin, { path: "/api/sites", body }), undefined);
        return res.status < 400 ? { ok: true } : { ok: false, status: res.status, ...(await res.json()) };
      }, { accept: "must" });
      if (created !== "accepted") continue;
      const stored = await readSite(body.slug);
      expect.soft(stored, "stored as sent").toMatchObject(edge);
      const gw = await createGateway((await Site.findOne({ where: { slug: body.slug } }))!);
      await createGatewayToken(gw);
      const res = await estimateRoute(await send("GET", admin, { path: "/" }), { params: Promise.resolve({ site: body.slug }) });
      expect.soft(res.status, `estimate for ${JSON.stringify(edge)}`).toBe(200);
    }
  }, SLOW);

  it("leaves the accounts that were there before untouched", async () => {
    const now = await User.findAll({ where: { id: before.map((u) => u.id) }, attributes: ["id", "email", "name", "role", "active", "passwordHash"], order: [["id", "ASC"]], raw: true });
    expect(now).toEqual(before);
  });

  it("counts its cases", () => {
    const total = h.summary();
    expect(total).toBeGreaterThanOrEqual(MIN_CASES);
  });
});
