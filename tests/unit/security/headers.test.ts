import { describe, expect, it } from "vitest";
import { API_CONTENT_SECURITY_POLICY, createNonce, pageContentSecurityPolicy, SECURITY_HEADERS } from "@/lib/security/headers";

const directives = (csp: string) => new Map(csp.split(";").map((d) => d.trim().split(/\s+/)).map(([name, ...values]) => [name, values]));

describe("page Content-Security-Policy", () => {
  it("allows scripts only by this request's nonce (no inline, no eval in production)", () => {
    const d = directives(pageContentSecurityPolicy("abc123=="));
    expect(d.get("default-src")).toEqual(["'self'"]);
    expect(d.get("script-src")).toEqual(["'self'", "'nonce-abc123=='", "'strict-dynamic'"]);
    expect(d.get("script-src")).not.toContain("'unsafe-inline'");
    expect(d.get("frame-ancestors")).toEqual(["'none'"]);
    expect(d.get("object-src")).toEqual(["'none'"]);
    expect(d.get("base-uri")).toEqual(["'self'"]);
    expect(d.get("form-action")).toEqual(["'self'"]);
    expect(d.get("worker-src")).toEqual(["'self'", "blob:"]);
    // A nonce in style-src would make the browser ignore 'unsafe-inline' and break React style attributes.
    expect(d.get("style-src")).toEqual(["'self'", "'unsafe-inline'"]);
  });

  it("adds 'unsafe-eval' only in development", () => {
    expect(directives(pageContentSecurityPolicy("n", { dev: true })).get("script-src")).toContain("'unsafe-eval'");
    expect(pageContentSecurityPolicy("n")).not.toContain("unsafe-eval");
  });

  it("makes a fresh 128-bit nonce each time", () => {
    const nonces = new Set(Array.from({ length: 100 }, createNonce));
    expect(nonces.size).toBe(100);
    for (const n of nonces) expect(Buffer.from(n, "base64")).toHaveLength(16);
  });
});

describe("headers on every response", () => {
  const byKey = new Map(SECURITY_HEADERS.map((h) => [h.key.toLowerCase(), h.value]));

  it("denies framing, sniffing and cross-origin referrers, and never sets Cache-Control", () => {
    expect(byKey.get("x-frame-options")).toBe("DENY");
    expect(byKey.get("x-content-type-options")).toBe("nosniff");
    expect(byKey.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
    expect(byKey.has("cache-control")).toBe(false);
    expect(byKey.has("content-security-policy")).toBe(false);
  });

  it("switches off device features in Permissions-Policy", () => {
    const policy = byKey.get("permissions-policy")!;
    for (const f of ["camera", "microphone", "geolocation", "payment", "usb"]) expect(policy).toContain(`${f}=()`);
  });

  it("lets nothing load from or frame an API answer", () => {
    expect(directives(API_CONTENT_SECURITY_POLICY)).toEqual(new Map([["default-src", ["'none'"]], ["frame-ancestors", ["'none'"]]]));
  });
});
