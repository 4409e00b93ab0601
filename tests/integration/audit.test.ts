import { describe, expect, it } from "vitest";
import { GET as auditRoute } from "@/app/api/audit/route";
import { POST as createUserRoute } from "@/app/api/users/route";
import { POST as createSiteRoute } from "@/app/api/sites/route";
import { createUser, request } from "../factories";
import { siteBody } from "./matrix/samples";

describe("audit log API", () => {
  it("filters by site, user, action and time, and pages through results", async () => {
    const admin = await createUser({ role: "admin" });
    const start = new Date(Date.now() - 1000).toISOString();
    const bodies = [siteBody(), siteBody(), siteBody()];
    for (const body of bodies) await createSiteRoute(await request("POST", "/api/sites", { user: admin, body }), undefined);
    const get = async (qs: string, user = admin) => (await auditRoute(await request("GET", `/api/audit?${qs}`, { user }), undefined)).json();

    const byUser = await get(`user=${encodeURIComponent(admin.email)}`);
    expect(byUser.total).toBe(3);
    expect(byUser.entries.map((e: { entityLabel: string }) => e.entityLabel)).toEqual(bodies.map((b) => b.slug).reverse());

    const bySite = await get(`site=${bodies[1].slug}`);
    expect(bySite.total).toBe(1);
    expect(bySite.entries[0]).toMatchObject({ action: "site.create", siteSlug: bodies[1].slug, before: null, after: { slug: bodies[1].slug } });

    const paged = await get(`user=${encodeURIComponent(admin.email)}&pageSize=5&page=1`);
    expect(paged).toMatchObject({ page: 1, pageSize: 5, pages: 1 });
    const page2 = await get(`user=${encodeURIComponent(admin.email)}&action=site.create&pageSize=5&page=2`);
    expect(page2.entries).toEqual([]);
    expect(page2.total).toBe(3);

    const inWindow = await get(`user=${encodeURIComponent(admin.email)}&from=${start}&to=${new Date(Date.now() + 1000).toISOString()}`);
    expect(inWindow.total).toBe(3);
    const before = await get(`user=${encodeURIComponent(admin.email)}&to=${start}`);
    expect(before.total).toBe(0);
  });

  it("names the field of a bad filter", async () => {
    const viewer = await createUser({ role: "viewer" });
    const res = await auditRoute(await request("GET", "/api/audit?from=yesterday", { user: viewer }), undefined);
    expect(res.status).toBe(422);
    expect(await res.json()).toMatchObject({ field: "from" });
    const swapped = await auditRoute(await request("GET", "/api/audit?from=2026-12-02T00:00Z&to=2026-12-01T00:00Z", { user: viewer }), undefined);
    expect(swapped.status).toBe(422);
    const page = await auditRoute(await request("GET", "/api/audit?page=0", { user: viewer }), undefined);
    expect(await page.json()).toMatchObject({ field: "page" });
  });

  it("hides entries about user accounts from everyone but admins", async () => {
    const admin = await createUser({ role: "admin" });
    const email = `hidden-${Date.now()}@test.invalid`;
    await createUserRoute(await request("POST", "/api/users", { user: admin, body: { email, name: "Hidden", role: "viewer" } }), undefined);
    const q = `/api/audit?action=user.create&pageSize=200`;
    const asAdmin = await (await auditRoute(await request("GET", q, { user: admin }), undefined)).json();
    expect(asAdmin.entries.some((e: { entityLabel: string }) => e.entityLabel === email)).toBe(true);
    const reviewer = await createUser({ role: "reviewer" });
    const asReviewer = await (await auditRoute(await request("GET", q, { user: reviewer }), undefined)).json();
    expect(asReviewer.total).toBe(0);
  });
});
