import { randomUUID } from "node:crypto";
import { Change, type Gateway, type Site, type Tag } from "@/models";
import { profileToYaml } from "@/lib/profiles/yaml";
import { encodeSeriesWire } from "@/lib/samples/wire";
import { createAssignment, createGateway, createGatewayToken, createGroup, createProfile, createSampleSet, createSite, createTag, createUser, profileDocument } from "../../factories";

// One valid request per route and one valid input per server action, so that an allowed
// role gets a success and the matrix measures authorisation alone. Called once per role:
// samples that create or delete records make fresh ones.

export type Fixture = { site: Site; gateway: Gateway; tag: Tag };

export async function makeFixture(): Promise<Fixture> {
  const site = await createSite();
  const gateway = await createGateway(site);
  const tag = await createTag(site, gateway);
  return { site, gateway, tag };
}

const u = () => randomUUID().slice(0, 8);

export const siteBody = () => ({
  name: `Matrix site ${u()}`,
  slug: `matrix-${u()}`,
  timeZone: "Europe/Dublin",
  uplinkBudgetKbps: 128,
  storagePricePerGbMonth: 0.02,
  retentionMonths: 12,
  defaultHandling: "pass-through",
});

export const tagBody = (gateway: string) => ({
  name: `AREA/TT-${u()}/PV`,
  unit: "degC",
  samplePeriodMs: 1000,
  kind: "analog",
  euLow: 0,
  euHigh: 150,
  area: "AREA",
  equipment: null,
  gateway,
});

export const groupBody = () => ({
  name: `group-${u()}`,
  description: "",
  regulated: false,
  selector: { patterns: ["AREA/*/PV"], units: [], kinds: [], areas: [], equipment: [], gateways: [], minPeriodMs: null, maxPeriodMs: null, include: [], exclude: [] },
});

export const gatewayBody = () => ({ name: `Matrix gateway ${u()}`, slug: `mgw-${u()}`, description: "", pollSeconds: 60 });

type RouteSample = (fx: Fixture) => Promise<{ path: string; params?: Record<string, string>; body?: unknown; rawBody?: string; binaryBody?: ArrayBuffer }>;

export const ROUTE_SAMPLES: Record<string, RouteSample> = {
  // Console sessions never open the gateway API; the token cases are in GATEWAY_SAMPLES.
  "GET /api/gateway/v1/bundle": async () => ({ path: "/api/gateway/v1/bundle" }),
  "GET /api/gateway/v1/signing-key": async () => ({ path: "/api/gateway/v1/signing-key" }),
  "PUT /api/gateway/v1/check-in": async () => ({ path: "/api/gateway/v1/check-in", body: {} }),
  "GET /api/gateway/v1/openapi.json": async () => ({ path: "/api/gateway/v1/openapi.json" }),
  "GET /api/health": async () => ({ path: "/api/health" }),
  "GET /api/me": async () => ({ path: "/api/me" }),
  "GET /api/audit": async () => ({ path: "/api/audit?page=1" }),
  "GET /api/users": async () => ({ path: "/api/users" }),
  "POST /api/users": async () => ({ path: "/api/users", body: { email: `m-${u()}@test.invalid`, name: "Matrix", role: "viewer" } }),
  "PATCH /api/users/[id]": async () => {
    const user = await createUser();
    return { path: `/api/users/${user.id}`, params: { id: String(user.id) }, body: { role: "engineer" } };
  },
  "POST /api/users/[id]/password": async () => {
    const user = await createUser();
    return { path: `/api/users/${user.id}/password`, params: { id: String(user.id) } };
  },
  "GET /api/sites": async () => ({ path: "/api/sites" }),
  "POST /api/sites": async () => ({ path: "/api/sites", body: siteBody() }),
  "GET /api/sites/[site]": async (fx) => ({ path: `/api/sites/${fx.site.slug}`, params: { site: fx.site.slug } }),
  "PATCH /api/sites/[site]": async () => {
    const site = await createSite();
    return { path: `/api/sites/${site.slug}`, params: { site: site.slug }, body: { ...siteBody(), slug: site.slug } };
  },
  "DELETE /api/sites/[site]": async () => {
    const site = await createSite();
    return { path: `/api/sites/${site.slug}`, params: { site: site.slug } };
  },
  "GET /api/sites/[site]/gateways": async (fx) => ({ path: `/api/sites/${fx.site.slug}/gateways`, params: { site: fx.site.slug } }),
  "POST /api/sites/[site]/gateways": async (fx) => ({
    path: `/api/sites/${fx.site.slug}/gateways`,
    params: { site: fx.site.slug },
    body: gatewayBody(),
  }),
  "GET /api/sites/[site]/gateways/[gateway]": async (fx) => ({
    path: `/api/sites/${fx.site.slug}/gateways/${fx.gateway.slug}`,
    params: { site: fx.site.slug, gateway: fx.gateway.slug },
  }),
  "PATCH /api/sites/[site]/gateways/[gateway]": async (fx) => ({
    path: `/api/sites/${fx.site.slug}/gateways/${fx.gateway.slug}`,
    params: { site: fx.site.slug, gateway: fx.gateway.slug },
    body: { ...gatewayBody(), slug: fx.gateway.slug },
  }),
  "DELETE /api/sites/[site]/gateways/[gateway]": async (fx) => {
    const gw = await createGateway(fx.site);
    return { path: `/api/sites/${fx.site.slug}/gateways/${gw.slug}`, params: { site: fx.site.slug, gateway: gw.slug } };
  },
  "GET /api/sites/[site]/gateways/[gateway]/tokens": async (fx) => ({
    path: `/api/sites/${fx.site.slug}/gateways/${fx.gateway.slug}/tokens`,
    params: { site: fx.site.slug, gateway: fx.gateway.slug },
  }),
  "POST /api/sites/[site]/gateways/[gateway]/tokens": async (fx) => ({
    path: `/api/sites/${fx.site.slug}/gateways/${fx.gateway.slug}/tokens`,
    params: { site: fx.site.slug, gateway: fx.gateway.slug },
    body: { label: "matrix" },
  }),
  "DELETE /api/sites/[site]/gateways/[gateway]/tokens/[tokenId]": async (fx) => {
    const token = await createGatewayToken(fx.gateway);
    return { path: "/", params: { site: fx.site.slug, gateway: fx.gateway.slug, tokenId: String(token.id) } };
  },
  "GET /api/sites/[site]/tags": async (fx) => ({ path: `/api/sites/${fx.site.slug}/tags`, params: { site: fx.site.slug } }),
  "POST /api/sites/[site]/tags": async (fx) => ({ path: `/api/sites/${fx.site.slug}/tags`, params: { site: fx.site.slug }, body: tagBody(fx.gateway.slug) }),
  "DELETE /api/sites/[site]/tags": async (fx) => {
    const tag = await createTag(fx.site, fx.gateway);
    return { path: `/api/sites/${fx.site.slug}/tags`, params: { site: fx.site.slug }, body: { ids: [tag.id] } };
  },
  "PATCH /api/sites/[site]/tags/[tagId]": async (fx) => ({
    path: `/api/sites/${fx.site.slug}/tags/${fx.tag.id}`,
    params: { site: fx.site.slug, tagId: String(fx.tag.id) },
    body: { ...tagBody(fx.gateway.slug), name: fx.tag.name, unit: "degF", euLow: 32, euHigh: 300 },
  }),
  "DELETE /api/sites/[site]/tags/[tagId]": async (fx) => {
    const tag = await createTag(fx.site, fx.gateway);
    return { path: "/", params: { site: fx.site.slug, tagId: String(tag.id) } };
  },
  "POST /api/sites/[site]/tags/import": async (fx) => ({
    path: `/api/sites/${fx.site.slug}/tags/import`,
    params: { site: fx.site.slug },
    body: { rows: [tagBody(fx.gateway.slug)], dryRun: true },
  }),
  "GET /api/sites/[site]/tags/export": async (fx) => ({ path: "/", params: { site: fx.site.slug } }),
  "GET /api/sites/[site]/groups": async (fx) => ({ path: "/", params: { site: fx.site.slug } }),
  "POST /api/sites/[site]/groups": async (fx) => ({ path: "/", params: { site: fx.site.slug }, body: groupBody() }),
  "GET /api/sites/[site]/groups/[groupId]": async (fx) => {
    const g = await createGroup(fx.site);
    return { path: "/", params: { site: fx.site.slug, groupId: String(g.id) } };
  },
  "PATCH /api/sites/[site]/groups/[groupId]": async (fx) => {
    const g = await createGroup(fx.site);
    return { path: "/", params: { site: fx.site.slug, groupId: String(g.id) }, body: groupBody() };
  },
  "DELETE /api/sites/[site]/groups/[groupId]": async (fx) => {
    const g = await createGroup(fx.site);
    return { path: "/", params: { site: fx.site.slug, groupId: String(g.id) } };
  },
  "PUT /api/sites/[site]/groups/order": async () => {
    const site = await createSite();
    const a = await createGroup(site);
    const b = await createGroup(site);
    return { path: "/", params: { site: site.slug }, body: { order: [b.id, a.id] } };
  },
  "POST /api/sites/[site]/groups/preview": async (fx) => ({ path: "/", params: { site: fx.site.slug }, body: { selector: groupBody().selector } }),
  "GET /api/sites/[site]/coverage": async (fx) => ({ path: "/", params: { site: fx.site.slug } }),
  "GET /api/sites/[site]/draft": async (fx) => ({ path: "/", params: { site: fx.site.slug } }),
  "POST /api/sites/[site]/draft/discard": async () => {
    const site = await createSite();
    await createGroup(site, { name: "to-discard" });
    await Change.create({ siteId: site.id, baseRelease: null, createdBy: null });
    return { path: "/", params: { site: site.slug }, body: { all: true } };
  },
  "GET /api/sites/[site]/assignments": async (fx) => ({ path: "/", params: { site: fx.site.slug } }),
  "GET /api/sites/[site]/groups/[groupId]/assignment": async (fx) => {
    const g = await createGroup(fx.site);
    return { path: "/", params: { site: fx.site.slug, groupId: String(g.id) } };
  },
  "PUT /api/sites/[site]/groups/[groupId]/assignment": async (fx) => {
    const g = await createGroup(fx.site, { patterns: ["NOWHERE/*"] });
    const { profile } = await createProfile();
    return { path: "/", params: { site: fx.site.slug, groupId: String(g.id) }, body: { profileId: profile.id, revision: 1 } };
  },
  "DELETE /api/sites/[site]/groups/[groupId]/assignment": async (fx) => {
    const g = await createGroup(fx.site, { patterns: ["NOWHERE/*"] });
    await createAssignment(g, (await createProfile()).revision);
    return { path: "/", params: { site: fx.site.slug, groupId: String(g.id) } };
  },
  "GET /api/sites/[site]/groups/[groupId]/samples": async (fx) => {
    const g = await createGroup(fx.site);
    return { path: "/", params: { site: fx.site.slug, groupId: String(g.id) } };
  },
  "POST /api/sites/[site]/groups/[groupId]/samples": async (fx) => {
    const g = await createGroup(fx.site);
    const path = `/api/sites/${fx.site.slug}/groups/${g.id}/samples?name=m&tag=${encodeURIComponent(fx.tag.name)}`;
    return { path, params: { site: fx.site.slug, groupId: String(g.id) }, binaryBody: encodeSeriesWire({ t: Float64Array.of(1, 2, 3), v: Float64Array.of(1, 2, 1) }) };
  },
  "GET /api/sample-sets/[sampleSetId]": async (fx) => ({ path: "/", params: { sampleSetId: String((await createSampleSet(fx.site, fx.tag)).id) } }),
  "DELETE /api/sample-sets/[sampleSetId]": async (fx) => ({ path: "/", params: { sampleSetId: String((await createSampleSet(fx.site, fx.tag)).id) } }),
  "GET /api/sample-sets/[sampleSetId]/data": async (fx) => ({ path: "/", params: { sampleSetId: String((await createSampleSet(fx.site, fx.tag)).id) } }),
  "GET /api/sites/[site]/estimate": async (fx) => ({ path: "/", params: { site: fx.site.slug } }),
  "GET /api/estimates": async () => ({ path: "/api/estimates" }),
  "GET /api/fleet": async (fx) => ({ path: `/api/fleet?site=${fx.site.slug}` }),
  "GET /api/sites/[site]/changes": async (fx) => ({ path: "/", params: { site: fx.site.slug } }),
  "POST /api/sites/[site]/changes": async () => {
    const { site } = await draftSite();
    return { path: "/", params: { site: site.slug }, body: { note: "matrix" } };
  },
  "GET /api/sites/[site]/changes/[changeId]": async () => {
    const { site, change } = await draftSite();
    return { path: "/", params: { site: site.slug, changeId: String(change.id) } };
  },
  "POST /api/sites/[site]/changes/[changeId]/approve": async () => {
    const { site, change } = await draftSite("in_review");
    return { path: "/", params: { site: site.slug, changeId: String(change.id) }, body: {} };
  },
  "POST /api/sites/[site]/changes/[changeId]/reject": async () => {
    const { site, change } = await draftSite("in_review");
    return { path: "/", params: { site: site.slug, changeId: String(change.id) }, body: { comment: "no" } };
  },
  "POST /api/sites/[site]/changes/[changeId]/release": async () => {
    const { site, change } = await draftSite("approved");
    return { path: "/", params: { site: site.slug, changeId: String(change.id) } };
  },
  "GET /api/sites/[site]/releases": async (fx) => ({ path: "/", params: { site: fx.site.slug } }),
  "GET /api/sites/[site]/releases/compare": async () => {
    const { site } = await releasedSite(2);
    return { path: "/x?from=1&to=2", params: { site: site.slug } };
  },
  "GET /api/sites/[site]/releases/[number]/bundles/[gateway]": async () => {
    const { site, gateway } = await releasedSite(1);
    return { path: "/", params: { site: site.slug, number: "1", gateway: gateway.slug } };
  },
  "POST /api/sites/[site]/rollbacks": async () => {
    const { site } = await releasedSite(2, true);
    return { path: "/", params: { site: site.slug }, body: { release: 1 } };
  },
  "POST /api/sites/[site]/rollbacks/urgent": async () => {
    const { site } = await releasedSite(2, true);
    return { path: "/", params: { site: site.slug }, body: { release: 1, reason: "matrix urgent path" } };
  },
  "GET /api/profiles": async () => ({ path: "/api/profiles?status=all" }),
  "POST /api/profiles": async () => ({ path: "/api/profiles", body: { document: profileDocument(), note: "matrix" } }),
  "POST /api/profiles/import": async () => ({ path: "/api/profiles/import", rawBody: profileToYaml(profileDocument()) }),
  "GET /api/profiles/[profileId]": async () => ({ path: "/", params: { profileId: String((await createProfile()).profile.id) } }),
  "PATCH /api/profiles/[profileId]": async () => ({ path: "/", params: { profileId: String((await createProfile()).profile.id) }, body: { archived: true } }),
  "POST /api/profiles/[profileId]/revisions": async () => {
    const { profile, revision } = await createProfile();
    return { path: "/", params: { profileId: String(profile.id) }, body: { document: { ...revision.document, description: "changed" }, note: "matrix", baseRevision: 1 } };
  },
  "GET /api/profiles/[profileId]/revisions/[revision]": async () => ({ path: "/", params: { profileId: String((await createProfile()).profile.id), revision: "1" } }),
  "GET /api/profiles/[profileId]/diff": async () => ({ path: "/api/profiles/x/diff?from=1&to=1", params: { profileId: String((await createProfile()).profile.id) } }),
  "POST /api/profiles/[profileId]/duplicate": async () => ({ path: "/", params: { profileId: String((await createProfile()).profile.id) }, body: { name: `Copy ${u()}` } }),
  "GET /api/profiles/[profileId]/export": async () => ({ path: "/", params: { profileId: String((await createProfile()).profile.id) } }),
};

/** A site with a tag, a group assigned a profile, and its open change in the given state (config and review snapshot when past draft). */
async function draftSite(state: "draft" | "in_review" | "approved" = "draft") {
  const site = await createSite();
  const gateway = await createGateway(site);
  await createTag(site, gateway, { name: "AREA/TT-1/PV" });
  const group = await createGroup(site);
  await createAssignment(group, (await createProfile()).revision);
  const { loadWorkingConfig } = await import("@/lib/data/groups");
  const config = await loadWorkingConfig(site.id);
  const change = await Change.create({ siteId: site.id, baseRelease: null, createdBy: null });
  if (state !== "draft") {
    const review = { release: 1, issued: "", gateways: [], summary: [], regulatedTouched: [], gatewaysAffected: [], impact: null };
    await change.update({ state, config, review });
  }
  return { site, gateway, change };
}

/** A site with `n` releases published through the data layer; with `differ`, release 1 holds no groups so later ones differ. */
async function releasedSite(n: number, differ = false) {
  const { site, gateway, change } = await draftSite();
  await change.destroy();
  const { publishRelease } = await import("@/lib/data/releases");
  const { loadWorkingConfig } = await import("@/lib/data/groups");
  const { sequelize } = await import("@/models");
  const config = await loadWorkingConfig(site.id);
  const admin = await createUser({ role: "admin" });
  const actor = { id: admin.id, email: admin.email, name: admin.name, role: "admin" as const };
  for (let i = 1; i <= n; i++) await sequelize.transaction((t) => publishRelease(site, differ && i === 1 ? { groups: [] } : config, { changeId: null, actor }, t));
  await site.reload();
  return { site, gateway };
}

export const ACTION_SAMPLES: Record<string, (fx: Fixture) => Promise<unknown>> = {
  "(console)/admin/users/actions.ts#createUserAction": async () => ({ email: `a-${u()}@test.invalid`, name: "Action", role: "engineer" }),
  "(console)/admin/users/actions.ts#updateUserAction": async () => ({ id: (await createUser()).id, patch: { role: "reviewer" } }),
  "(console)/admin/users/actions.ts#resetPasswordAction": async () => ({ id: (await createUser()).id }),
  "(console)/sites/actions.ts#createSiteAction": async () => siteBody(),
  "(console)/sites/actions.ts#updateSiteAction": async () => {
    const site = await createSite();
    return { site: site.slug, values: { ...siteBody(), slug: site.slug } };
  },
  "(console)/sites/actions.ts#deleteSiteAction": async () => ({ site: (await createSite()).slug }),
  "(console)/sites/actions.ts#createGatewayAction": async (fx) => ({ site: fx.site.slug, values: gatewayBody() }),
  "(console)/sites/actions.ts#updateGatewayAction": async (fx) => ({
    site: fx.site.slug,
    gateway: fx.gateway.slug,
    values: { ...gatewayBody(), slug: fx.gateway.slug },
  }),
  "(console)/sites/actions.ts#deleteGatewayAction": async (fx) => ({ site: fx.site.slug, gateway: (await createGateway(fx.site)).slug }),
  "(console)/sites/[site]/gateways/[gateway]/actions.ts#issueGatewayTokenAction": async (fx) => ({
    site: fx.site.slug,
    gateway: fx.gateway.slug,
    values: { label: "matrix action" },
  }),
  "(console)/sites/[site]/gateways/[gateway]/actions.ts#revokeGatewayTokenAction": async (fx) => ({
    site: fx.site.slug,
    gateway: fx.gateway.slug,
    tokenId: (await createGatewayToken(fx.gateway)).id,
  }),
};

/**
 * For each gateway route, a request that a live token of a released gateway may make: the
 * matrix sends it with no token, a console session, an unknown token, a revoked token and
 * the live one.
 */
export const GATEWAY_SAMPLES: Record<string, (g: { gatewayId: number; release: number; digest: string }) => { path: string; body?: unknown }> = {
  "GET /api/gateway/v1/bundle": () => ({ path: "/api/gateway/v1/bundle" }),
  "GET /api/gateway/v1/signing-key": () => ({ path: "/api/gateway/v1/signing-key" }),
  "PUT /api/gateway/v1/check-in": (g) => ({
    path: "/api/gateway/v1/check-in",
    body: { report: randomUUID(), release: g.release, digest: g.digest, status: "running", appliedAt: new Date().toISOString(), pointsIn: 10, pointsOut: 2, from: new Date(Date.now() - 60_000).toISOString(), to: new Date().toISOString() },
  }),
};

/** A site with one release and a live token for its gateway. */
export async function releasedGateway() {
  const { site, gateway } = await releasedSite(1);
  const { generateToken } = await import("@/lib/gateway/token");
  const { GatewayToken, Gateway: GatewayModel, Bundle } = await import("@/models");
  const live = generateToken();
  const revoked = generateToken();
  await GatewayToken.create({ gatewayId: gateway.id, tokenHash: live.hash, prefix: live.prefix, createdBy: null });
  await GatewayToken.create({ gatewayId: gateway.id, tokenHash: revoked.hash, prefix: revoked.prefix, createdBy: null, revokedAt: new Date() });
  const g = await GatewayModel.findByPk(gateway.id);
  const bundle = await Bundle.findByPk(g!.currentBundleId!);
  return { site, gateway, token: live.token, revokedToken: revoked.token, release: site.releaseCounter, digest: bundle!.digest, gatewayId: gateway.id };
}
