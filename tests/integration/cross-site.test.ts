import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as createSiteRoute } from "@/app/api/sites/route";
import { PUT as checkInRoute } from "@/app/api/gateway/v1/check-in/route";
import { AuditEvent, GatewayReport, Site, type User } from "@/models";
import { createUser, ctx, request } from "../factories";
import { GATEWAY_SAMPLES, ROUTE_SAMPLES, makeFixture, releasedGateway, siteBody, type Fixture } from "./matrix/samples";

// Cross-site request protection in route() (lib/http.ts, lib/security/origin.ts): a
// browser on another origin carrying an admin's session cookie changes nothing.

const EVIL = "https://evil.example";
// With no NEXTAUTH_URL in tests, the Host the request was sent to is the app's own origin.
const OWN = "http://127.0.0.1:3000";
const own = { origin: OWN, host: "127.0.0.1:3000" };
const STATE_CHANGING = ["POST", "PUT", "PATCH", "DELETE"];

const appDir = path.resolve("app");
function routeFiles(dir: string, out: string[] = []): string[] {
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) routeFiles(p, out);
    else if (e.name === "route.ts") out.push(p);
  }
  return out;
}
const routeKey = (file: string, method: string) =>
  `${method} /${path.relative(appDir, path.dirname(file)).split(path.sep).filter((s) => !/^\(.*\)$/.test(s)).join("/")}`;

type Handler = (req: Request, c: unknown) => Promise<Response>;

async function stateChangingRoutes(): Promise<{ key: string; handler: Handler }[]> {
  const out: { key: string; handler: Handler }[] = [];
  for (const file of routeFiles(appDir)) {
    const mod = await import(file);
    for (const m of STATE_CHANGING) {
      const key = routeKey(file, m);
      if (typeof mod[m] === "function" && !key.includes(" /api/auth/") && !key.includes(" /api/gateway/")) out.push({ key, handler: mod[m] });
    }
  }
  return out;
}

describe("cross-site requests to state-changing routes", () => {
  let admin: User;
  let fx: Fixture;
  beforeAll(async () => {
    admin = await createUser({ role: "admin" });
    fx = await makeFixture();
  });

  it("refuses a cross-origin POST that carries a valid admin session, and writes nothing", async () => {
    const body = siteBody();
    const audits = await AuditEvent.count();
    const res = await createSiteRoute(await request("POST", "/api/sites", { user: admin, body, headers: { origin: EVIL } }), undefined);
    expect(res.status).toBe(403);
    expect(await res.json()).toEqual({ error: expect.stringContaining(EVIL), field: "origin" });
    expect(await Site.findOne({ where: { slug: body.slug } })).toBeNull();
    expect(await AuditEvent.count()).toBe(audits);
  });

  it("accepts the same POST from the app's own origin", async () => {
    const body = siteBody();
    const res = await createSiteRoute(await request("POST", "/api/sites", { user: admin, body, headers: { ...own, "sec-fetch-site": "same-origin" } }), undefined);
    expect(res.status).toBe(201);
    expect(await Site.findOne({ where: { slug: body.slug } })).not.toBeNull();
  });

  it("refuses a request without Origin that the browser marks cross-site, or whose Referer is another site", async () => {
    for (const headers of [{ "sec-fetch-site": "cross-site" }, { "sec-fetch-site": "same-site" }, { referer: `${EVIL}/form.html` }] as Record<string, string>[]) {
      const body = siteBody();
      const res = await createSiteRoute(await request("POST", "/api/sites", { user: admin, body, headers }), undefined);
      expect(res.status, JSON.stringify(headers)).toBe(403);
      expect((await res.json()).field).toBe("origin");
      expect(await Site.findOne({ where: { slug: body.slug } })).toBeNull();
    }
  });

  it("lets a non-browser client with a session through when it sends neither Origin, Sec-Fetch-Site nor Referer (as curl does)", async () => {
    const body = siteBody();
    const res = await createSiteRoute(await request("POST", "/api/sites", { user: admin, body, headers: { "user-agent": "curl/8.5.0" } }), undefined);
    expect(res.status).toBe(201);
  });

  it("guards every POST, PUT, PATCH and DELETE route outside next-auth and the gateway API", async () => {
    const routes = await stateChangingRoutes();
    expect(routes.length).toBeGreaterThan(30);
    const audits = await AuditEvent.count();
    for (const { key, handler } of routes) {
      const sample = ROUTE_SAMPLES[key];
      expect(sample, `no sample request for ${key} in tests/integration/matrix/samples.ts`).toBeDefined();
      const method = key.split(" ")[0];
      const s = await sample(fx);
      const refused = await handler(await request(method, s.path, { user: admin, body: s.body, rawBody: s.rawBody, binaryBody: s.binaryBody, headers: { origin: EVIL } }), ctx(s.params ?? {}));
      expect(refused.status, `${key} from ${EVIL}`).toBe(403);
      expect((await refused.json()).field, key).toBe("origin");
    }
    // Every write is audited: no refused request left a trace.
    expect(await AuditEvent.count()).toBe(audits);
    // The same samples from the app's own origin succeed, so the refusals above were the origin's doing.
    for (const { key, handler } of routes) {
      const method = key.split(" ")[0];
      const s = await ROUTE_SAMPLES[key](fx);
      const res = await handler(await request(method, s.path, { user: admin, body: s.body, rawBody: s.rawBody, binaryBody: s.binaryBody, headers: own }), ctx(s.params ?? {}));
      expect(res.status, `${key} from ${OWN}`).toBeLessThan(400);
    }
  });

  it("leaves the bearer-token gateway API to its token, whatever the Origin", async () => {
    const g = await releasedGateway();
    const s = GATEWAY_SAMPLES["PUT /api/gateway/v1/check-in"](g);
    const res = await checkInRoute(await request("PUT", s.path, { body: s.body, headers: { origin: EVIL, authorization: `Bearer ${g.token}`, "x-forwarded-for": "203.0.113.200" } }), undefined);
    expect(res.status).toBe(204);
    expect(await GatewayReport.count({ where: { gatewayId: g.gatewayId } })).toBe(1);
  });
});
