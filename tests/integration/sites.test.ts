import { describe, expect, it } from "vitest";
import { POST as createSiteRoute } from "@/app/api/sites/route";
import { DELETE as deleteSiteRoute, GET as getSiteRoute, PATCH as patchSiteRoute } from "@/app/api/sites/[site]/route";
import { POST as createGatewayRoute } from "@/app/api/sites/[site]/gateways/route";
import { DELETE as deleteGatewayRoute, GET as getGatewayRoute, PATCH as patchGatewayRoute } from "@/app/api/sites/[site]/gateways/[gateway]/route";
import { AuditEvent, Gateway, Site } from "@/models";
import { createGateway, createSite, createUser, ctx, request } from "../factories";
import { gatewayBody, siteBody } from "./matrix/samples";

const auditOf = (entityType: string, entityId: number) => AuditEvent.findAll({ where: { entityType, entityId }, order: [["id", "ASC"]] });

describe("sites API", () => {
  it("creates, reads, edits and deletes a site, each write audited once with before and after", async () => {
    const admin = await createUser({ role: "admin" });
    const body = siteBody();
    const created = await createSiteRoute(await request("POST", "/api/sites", { user: admin, body }), undefined);
    expect(created.status).toBe(201);
    const site = await created.json();
    expect(site).toMatchObject({ ...body, gatewayCount: 0 });
    const read = await getSiteRoute(await request("GET", "/", { user: admin }), ctx({ site: body.slug }));
    expect(await read.json()).toMatchObject(body);

    const edited = await patchSiteRoute(
      await request("PATCH", "/", { user: admin, body: { ...body, uplinkBudgetKbps: 64, defaultHandling: "drop" } }),
      ctx({ site: body.slug }),
    );
    expect(edited.status).toBe(200);
    expect(await edited.json()).toMatchObject({ uplinkBudgetKbps: 64, defaultHandling: "drop" });

    const del = await deleteSiteRoute(await request("DELETE", "/", { user: admin }), ctx({ site: body.slug }));
    expect(del.status).toBe(204);
    expect(await Site.findByPk(site.id)).toBeNull();

    const audit = await auditOf("site", site.id);
    expect(audit.map((a) => a.action)).toEqual(["site.create", "site.update", "site.delete"]);
    expect(audit.every((a) => a.siteId === site.id && a.actorId === admin.id)).toBe(true);
    expect(audit[0].beforeJson).toBeNull();
    expect(audit[0].afterJson).toMatchObject(body);
    expect(audit[1].beforeJson).toMatchObject({ uplinkBudgetKbps: 128, defaultHandling: "pass-through" });
    expect(audit[1].afterJson).toMatchObject({ uplinkBudgetKbps: 64, defaultHandling: "drop" });
    expect(audit[2].beforeJson).toMatchObject({ slug: body.slug, gateways: [] });
    expect(audit[2].afterJson).toBeNull();
  });

  it("names the field of bad input", async () => {
    const admin = await createUser({ role: "admin" });
    const cases: [Record<string, unknown>, string][] = [
      [{ timeZone: "Mars/Olympus_Mons" }, "timeZone"],
      [{ slug: "Bad Slug" }, "slug"],
      [{ slug: "-edge" }, "slug"],
      [{ uplinkBudgetKbps: 0 }, "uplinkBudgetKbps"],
      [{ uplinkBudgetKbps: "lots" }, "uplinkBudgetKbps"],
      [{ storagePricePerGbMonth: -1 }, "storagePricePerGbMonth"],
      [{ retentionMonths: 1.5 }, "retentionMonths"],
      [{ defaultHandling: "shred" }, "defaultHandling"],
      [{ name: "" }, "name"],
    ];
    for (const [patch, field] of cases) {
      const res = await createSiteRoute(await request("POST", "/api/sites", { user: admin, body: { ...siteBody(), ...patch } }), undefined);
      expect(res.status, JSON.stringify(patch)).toBe(422);
      expect(await res.json(), JSON.stringify(patch)).toMatchObject({ field, error: expect.any(String) });
    }
    const site = await createSite();
    const dup = await createSiteRoute(await request("POST", "/api/sites", { user: admin, body: { ...siteBody(), slug: site.slug } }), undefined);
    expect(dup.status).toBe(409);
    expect(await dup.json()).toMatchObject({ field: "slug" });
    const missing = await patchSiteRoute(await request("PATCH", "/", { user: admin, body: siteBody() }), ctx({ site: "no-such-site" }));
    expect(missing.status).toBe(404);
    expect(await AuditEvent.count({ where: { action: "site.create", entityLabel: site.slug } })).toBe(0);
  });

  it("deletes a site's gateways with it and records them in the one audit entry", async () => {
    const admin = await createUser({ role: "admin" });
    const site = await createSite();
    const g1 = await createGateway(site, { slug: `a-${site.id}` });
    const g2 = await createGateway(site, { slug: `b-${site.id}` });
    const res = await deleteSiteRoute(await request("DELETE", "/", { user: admin }), ctx({ site: site.slug }));
    expect(res.status).toBe(204);
    expect(await Gateway.count({ where: { siteId: site.id } })).toBe(0);
    const audit = await auditOf("site", site.id);
    expect(audit).toHaveLength(1);
    expect(audit[0].beforeJson).toMatchObject({ gateways: [g1.slug, g2.slug] });
  });

  it("shows an engineer and a viewer the site but refuses their edits", async () => {
    const site = await createSite();
    for (const role of ["viewer", "engineer", "reviewer"] as const) {
      const user = await createUser({ role });
      expect((await getSiteRoute(await request("GET", "/", { user }), ctx({ site: site.slug }))).status).toBe(200);
      const res = await patchSiteRoute(await request("PATCH", "/", { user, body: siteBody() }), ctx({ site: site.slug }));
      expect(res.status).toBe(403);
    }
    expect((await deleteSiteRoute(await request("DELETE", "/", {}), ctx({ site: site.slug }))).status).toBe(401);
  });
});

describe("gateways API", () => {
  it("registers, edits and deletes a gateway, each write audited once", async () => {
    const admin = await createUser({ role: "admin" });
    const site = await createSite();
    const body = gatewayBody();
    const created = await createGatewayRoute(await request("POST", "/", { user: admin, body }), ctx({ site: site.slug }));
    expect(created.status).toBe(201);
    const gw = await created.json();
    expect(gw).toMatchObject({ ...body, siteId: site.id });
    const p = ctx({ site: site.slug, gateway: body.slug });
    expect(await (await getGatewayRoute(await request("GET", "/", { user: admin }), p)).json()).toMatchObject(body);
    const edited = await patchGatewayRoute(await request("PATCH", "/", { user: admin, body: { ...body, pollSeconds: 300, description: "Dryer" } }), p);
    expect(await edited.json()).toMatchObject({ pollSeconds: 300, description: "Dryer" });
    expect((await deleteGatewayRoute(await request("DELETE", "/", { user: admin }), p)).status).toBe(204);
    const audit = await auditOf("gateway", gw.id);
    expect(audit.map((a) => [a.action, a.beforeJson?.pollSeconds ?? null, a.afterJson?.pollSeconds ?? null])).toEqual([
      ["gateway.create", null, 60],
      ["gateway.update", 60, 300],
      ["gateway.delete", 300, null],
    ]);
    expect(audit.every((a) => a.siteId === site.id)).toBe(true);
  });

  it("names the field of bad input and refuses a slug already used in the fleet", async () => {
    const admin = await createUser({ role: "admin" });
    const site = await createSite();
    const other = await createGateway(await createSite());
    for (const [patch, field] of [
      [{ pollSeconds: 2 }, "pollSeconds"],
      [{ pollSeconds: "often" }, "pollSeconds"],
      [{ slug: "UPPER" }, "slug"],
      [{ description: "x".repeat(501) }, "description"],
    ] as [Record<string, unknown>, string][]) {
      const res = await createGatewayRoute(await request("POST", "/", { user: admin, body: { ...gatewayBody(), ...patch } }), ctx({ site: site.slug }));
      expect(res.status).toBe(422);
      expect(await res.json()).toMatchObject({ field });
    }
    const dup = await createGatewayRoute(await request("POST", "/", { user: admin, body: { ...gatewayBody(), slug: other.slug } }), ctx({ site: site.slug }));
    expect(dup.status).toBe(409);
    expect(await dup.json()).toMatchObject({ field: "slug" });
    const noSite = await createGatewayRoute(await request("POST", "/", { user: admin, body: gatewayBody() }), ctx({ site: "nowhere" }));
    expect(noSite.status).toBe(404);
    expect(await noSite.json()).toMatchObject({ field: "site" });
    const wrongSite = await getGatewayRoute(await request("GET", "/", { user: admin }), ctx({ site: site.slug, gateway: other.slug }));
    expect(wrongSite.status).toBe(404);
  });
});
