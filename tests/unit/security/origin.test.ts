import { describe, expect, it } from "vitest";
import { checkCrossSite } from "@/lib/security/origin";

const APP = "https://sluice.example.com";

function req(method: string, path: string, headers: Record<string, string> = {}, base = "http://127.0.0.1:3000") {
  return new Request(new URL(path, base), { method, headers });
}

describe("cross-site request check", () => {
  it("lets reads through whatever their origin", () => {
    for (const m of ["GET", "HEAD", "OPTIONS"]) expect(checkCrossSite(req(m, "/api/sites", { origin: "https://evil.example" }), APP)).toEqual({ ok: true });
  });

  it("refuses a state change whose Origin is another site, a sibling subdomain or null", () => {
    for (const origin of ["https://evil.example", "https://other.example.com", "http://sluice.example.com", "null", "not a url"]) {
      for (const m of ["POST", "PUT", "PATCH", "DELETE"]) {
        expect(checkCrossSite(req(m, "/api/sites", { origin, host: "127.0.0.1:3000" }), APP).ok, `${m} from ${origin}`).toBe(false);
      }
    }
  });

  it("accepts the configured origin, or the host the request was sent to", () => {
    expect(checkCrossSite(req("POST", "/api/sites", { origin: APP, host: "127.0.0.1:3000" }), APP)).toEqual({ ok: true });
    expect(checkCrossSite(req("POST", "/api/sites", { origin: "http://127.0.0.1:3000", host: "127.0.0.1:3000" }), APP)).toEqual({ ok: true });
    // Behind a proxy that forwards the public host name.
    expect(checkCrossSite(req("POST", "/api/sites", { origin: "https://console.plant.example", host: "10.0.0.5:3000", "x-forwarded-host": "console.plant.example" }))).toEqual({ ok: true });
    // Without NEXTAUTH_URL only the host counts, and a port is part of it.
    expect(checkCrossSite(req("POST", "/api/sites", { origin: "http://127.0.0.1:3001", host: "127.0.0.1:3000" })).ok).toBe(false);
  });

  it("without Origin, trusts Sec-Fetch-Site only for same-origin and user-typed requests", () => {
    expect(checkCrossSite(req("POST", "/api/sites", { "sec-fetch-site": "same-origin" }), APP).ok).toBe(true);
    expect(checkCrossSite(req("POST", "/api/sites", { "sec-fetch-site": "none" }), APP).ok).toBe(true);
    expect(checkCrossSite(req("POST", "/api/sites", { "sec-fetch-site": "cross-site" }), APP).ok).toBe(false);
    expect(checkCrossSite(req("POST", "/api/sites", { "sec-fetch-site": "same-site" }), APP).ok).toBe(false);
  });

  it("falls back to the Referer, then lets a client that sends none of them through", () => {
    expect(checkCrossSite(req("DELETE", "/api/sites/x", { referer: "https://evil.example/page" }), APP).ok).toBe(false);
    expect(checkCrossSite(req("DELETE", "/api/sites/x", { referer: `${APP}/sites/x/settings` }), APP).ok).toBe(true);
    expect(checkCrossSite(req("DELETE", "/api/sites/x", { cookie: "next-auth.session-token=abc" }), APP).ok).toBe(true);
  });

  it("leaves next-auth's own routes and the bearer-token gateway API alone", () => {
    const evil = { origin: "https://evil.example" };
    expect(checkCrossSite(req("POST", "/api/auth/callback/credentials", evil), APP).ok).toBe(true);
    expect(checkCrossSite(req("PUT", "/api/gateway/v1/check-in", evil), APP).ok).toBe(true);
    // A look-alike path is not exempt.
    expect(checkCrossSite(req("POST", "/api/gateways", evil), APP).ok).toBe(false);
  });
});
