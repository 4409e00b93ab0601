import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { BASE_URL, DEMO, launch, signIn, signInOverHttp } from "./browser";

// Web hardening against the production build: security headers on pages, the API and the
// gateway API; the nonce CSP working in the browser (no violations, the preview worker
// runs); cross-site refusals over real HTTP for route handlers and server actions.

// The models reach the test database through DATABASE_URL (set by scripts/stack.mjs).
vi.mock("server-only", () => ({}));

const EVIL = "https://evil.example";

function expectCommonHeaders(res: Response, label: string) {
  expect(res.headers.get("x-frame-options"), label).toBe("DENY");
  expect(res.headers.get("x-content-type-options"), label).toBe("nosniff");
  expect(res.headers.get("referrer-policy"), label).toBe("strict-origin-when-cross-origin");
  expect(res.headers.get("permissions-policy"), label).toMatch(/(^|, )camera=\(\)/);
  expect(res.headers.get("permissions-policy"), label).toMatch(/(^|, )geolocation=\(\)/);
  expect(res.headers.has("x-powered-by"), label).toBe(false);
}

const nonceOf = (csp: string | null) => /'nonce-([^']+)'/.exec(csp ?? "")?.[1];

describe("security headers", () => {
  let admin: string;
  beforeAll(async () => {
    admin = await signInOverHttp(DEMO.admin);
  });

  it("gives every page a CSP with a fresh nonce that Next puts on each of its scripts", async () => {
    const pages: [string, string | undefined][] = [
      ["/sign-in", undefined],
      ["/", admin],
      ["/sites/fenwick-creamery", admin],
      ["/workbench", admin],
    ];
    const nonces = new Set<string>();
    for (const [path, cookie] of pages) {
      const res = await fetch(`${BASE_URL}${path}`, { headers: cookie ? { cookie } : {}, redirect: "manual" });
      expect(res.status, path).toBe(200);
      expectCommonHeaders(res, path);
      const csp = res.headers.get("content-security-policy");
      expect(csp, path).toContain("default-src 'self'");
      expect(csp, path).toContain("frame-ancestors 'none'");
      expect(csp, path).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{20,}' 'strict-dynamic'(;|$)/);
      const nonce = nonceOf(csp)!;
      nonces.add(nonce);
      const html = await res.text();
      const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
      expect(scripts.length, path).toBeGreaterThan(0);
      for (const tag of scripts) expect(tag, `${path}: ${tag}`).toContain(`nonce="${nonce}"`);
    }
    expect(nonces.size).toBe(pages.length);
  });

  it("sends a signed-out visitor's redirect with the same headers", async () => {
    const res = await fetch(`${BASE_URL}/sites`, { redirect: "manual" });
    expect(res.status).toBe(307);
    expectCommonHeaders(res, "redirect");
    expect(res.headers.get("content-security-policy")).toContain("frame-ancestors 'none'");
  });

  it("gives API answers their own CSP and the common headers, success or error", async () => {
    for (const [path, cookie, status] of [
      ["/api/health", undefined, 200],
      ["/api/me", admin, 200],
      ["/api/me", undefined, 401],
      ["/api/gateway/v1/signing-key", undefined, 401],
    ] as const) {
      const res = await fetch(`${BASE_URL}${path}`, { headers: cookie ? { cookie } : {} });
      expect(res.status, path).toBe(status);
      expectCommonHeaders(res, path);
      expect(res.headers.get("content-security-policy"), path).toBe("default-src 'none'; frame-ancestors 'none'");
    }
    // The gateway API's own challenge survives.
    const challenge = await fetch(`${BASE_URL}/api/gateway/v1/signing-key`);
    expect(challenge.headers.get("www-authenticate")).toBe('Bearer realm="sluice"');
  });

  it("leaves the gateway bundle's own ETag and Cache-Control alone, on 200 and 304", async () => {
    const { Gateway, GatewayToken } = await import("@/models");
    const { generateToken } = await import("@/lib/gateway/token");
    const gateway = (await Gateway.findOne({ where: { slug: "fw-gw-02" } }))!;
    const t = generateToken();
    const row = await GatewayToken.create({ gatewayId: gateway.id, tokenHash: t.hash, prefix: t.prefix, label: "e2e web hardening", createdBy: null });
    try {
      // Identity encoding: the ETag is then the plain digest (a gzip answer has its own tag).
      const auth = { authorization: `Bearer ${t.token}`, "accept-encoding": "identity" };
      const full = await fetch(`${BASE_URL}/api/gateway/v1/bundle`, { headers: auth });
      expect(full.status).toBe(200);
      expect(full.headers.get("cache-control")).toBe("private, no-cache");
      const etag = full.headers.get("etag");
      expect(etag).toMatch(/^"[0-9a-f]{64}"$/);
      expect(full.headers.get("content-type")).toContain("application/yaml");
      expectCommonHeaders(full, "bundle 200");
      const again = await fetch(`${BASE_URL}/api/gateway/v1/bundle`, { headers: { ...auth, "if-none-match": etag! } });
      expect(again.status).toBe(304);
      expect(again.headers.get("cache-control")).toBe("private, no-cache");
      expect(again.headers.get("etag")).toBe(etag);
      expectCommonHeaders(again, "bundle 304");
    } finally {
      await row.destroy();
    }
  });
});

describe("cross-site requests over HTTP", () => {
  let admin: string;
  beforeAll(async () => {
    admin = await signInOverHttp(DEMO.admin);
  });

  const siteBody = (slug: string) => ({ name: `Hardening ${slug}`, slug, timeZone: "Europe/London", uplinkBudgetKbps: 64, storagePricePerGbMonth: 0.02, retentionMonths: 12, defaultHandling: "pass-through" });

  it("refuses a route-handler POST from another origin with the admin's cookie; accepts it from the app's own", async () => {
    const slug = `xsite-${Date.now().toString(36)}`;
    const post = (origin: string) =>
      fetch(`${BASE_URL}/api/sites`, { method: "POST", headers: { cookie: admin, origin, "content-type": "application/json" }, body: JSON.stringify(siteBody(slug)) });
    const refused = await post(EVIL);
    expect(refused.status).toBe(403);
    expect(await refused.json()).toEqual({ error: expect.any(String), field: "origin" });
    expect((await fetch(`${BASE_URL}/api/sites/${slug}`, { headers: { cookie: admin } })).status).toBe(404);
    const accepted = await post(BASE_URL);
    expect(accepted.status).toBe(201);
    const del = await fetch(`${BASE_URL}/api/sites/${slug}`, { method: "DELETE", headers: { cookie: admin, origin: BASE_URL } });
    expect(del.status).toBe(204);
  });

  describe("server actions (Next's own Origin check)", () => {
    let browser: Browser;
    beforeAll(async () => {
      browser = await launch();
    });
    afterAll(async () => {
      await browser?.close();
    });

    /** Submits the new-site form, holds back the server action request the browser makes, and returns it. */
    async function captureCreateSiteAction(page: Page, slug: string) {
      await signIn(page, DEMO.admin);
      await page.goto(`${BASE_URL}/sites/new`);
      await page.getByLabel("Name").fill(`Hardening ${slug}`);
      await page.getByLabel("Slug").fill(slug);
      const captured = new Promise<{ headers: Record<string, string>; body: string }>((resolve) => {
        void page.route(`${BASE_URL}/sites/new`, async (r) => {
          const req = r.request();
          if (req.method() === "POST" && req.headers()["next-action"]) {
            resolve({ headers: await req.allHeaders(), body: req.postData() ?? "" });
            await r.abort();
          } else await r.continue();
        });
      });
      await page.getByRole("button", { name: /create site/i }).click();
      return captured;
    }

    it("refuses an action replayed with a foreign Origin, writing nothing, and runs it from the app's own", async () => {
      const context = await browser.newContext();
      const page = await context.newPage();
      const slug = `xaction-${Date.now().toString(36)}`;
      const action = await captureCreateSiteAction(page, slug);
      expect(action.headers["next-action"]).toMatch(/^[0-9a-f]{20,}$/);
      const cookie = (await context.cookies()).map((c) => `${c.name}=${c.value}`).join("; ");
      const replay = (origin: string) =>
        fetch(`${BASE_URL}/sites/new`, {
          method: "POST",
          headers: {
            cookie,
            origin,
            accept: "text/x-component",
            "next-action": action.headers["next-action"],
            "content-type": action.headers["content-type"],
            ...(action.headers["next-router-state-tree"] ? { "next-router-state-tree": action.headers["next-router-state-tree"] } : {}),
          },
          body: action.body,
        });
      const siteStatus = async () => (await fetch(`${BASE_URL}/api/sites/${slug}`, { headers: { cookie } })).status;

      const refused = await replay(EVIL);
      expect(refused.status).toBe(500);
      await refused.text();
      expect(await siteStatus()).toBe(404);

      const accepted = await replay(BASE_URL);
      expect(accepted.status).toBe(200);
      await accepted.text();
      expect(await siteStatus()).toBe(200);
      await fetch(`${BASE_URL}/api/sites/${slug}`, { method: "DELETE", headers: { cookie, origin: BASE_URL } });
      await context.close();
    });
  });
});

describe("the CSP in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  /** Collects CSP violations reported by the page (events) and by Chromium (console). */
  async function watchViolations(page: Page) {
    const seen: string[] = [];
    await page.addInitScript(() => {
      document.addEventListener("securitypolicyviolation", (e) => {
        const w = window as unknown as { __csp?: string[] };
        (w.__csp ??= []).push(`${e.violatedDirective} ${e.blockedURI}`);
      });
    });
    page.on("console", (m) => {
      if (/Content Security Policy/i.test(m.text())) seen.push(m.text());
    });
    return async () => [...seen, ...(await page.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? []))];
  }

  it("runs the console, sign-in to the workbench preview worker, without a single violation", async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    const violations = await watchViolations(page);
    await signIn(page, DEMO.engineer);
    await page.goto(`${BASE_URL}/sites/fenwick-creamery/groups`);
    await page.getByRole("heading", { level: 1 }).waitFor();
    expect(await violations()).toEqual([]);
    await page.goto(`${BASE_URL}/workbench`);
    await page.getByLabel("Profile", { exact: true }).selectOption({ label: "Temperature shape (analog)" });
    await page.getByLabel(/^Deviation \(degC\)/).waitFor();
    const start = Date.UTC(2026, 2, 2, 6);
    const rows = Array.from({ length: 600 }, (_, i) => `${new Date(start + i * 1000).toISOString()},${(20 + Math.sin(i / 30) * 5).toFixed(3)},good`);
    await page.getByLabel("Sample data CSV").setInputFiles({ name: "csp.csv", mimeType: "text/csv", buffer: Buffer.from(["timestamp,value,quality", ...rows].join("\n") + "\n") });
    // The metrics come from the preview worker: it started under the CSP.
    await page.getByTestId("metrics-shape").filter({ hasText: "600" }).waitFor({ timeout: 30_000 });
    expect(await page.getByTestId("preview-chart").locator("canvas").count()).toBeGreaterThan(0);
    expect(await violations()).toEqual([]);
  });

  it("refuses to be framed", async () => {
    const page = await browser.newPage();
    await page.goto(`${BASE_URL}/sign-in`);
    // A same-origin frame is refused too (frame-ancestors 'none', X-Frame-Options: DENY).
    const framed = await page.evaluate(async (url) => {
      const frame = document.createElement("iframe");
      frame.src = url;
      const loaded = new Promise((r) => frame.addEventListener("load", r));
      document.body.append(frame);
      await loaded;
      try {
        return frame.contentDocument?.querySelector("h1")?.textContent ?? null;
      } catch {
        return null;
      }
    }, `${BASE_URL}/sign-in`);
    expect(framed).toBeNull();
  });
});
