import { createRequire } from "node:module";
import { NextRequest } from "next/server";
import { afterEach, describe, expect, it, vi } from "vitest";
import { createUser } from "../factories";

// Signs in through the real next-auth route handler (app/api/auth/[...nextauth]) and reads
// the Set-Cookie attributes, once for an http console address and once for an https one.
// The handler is imported afresh for each address, as a new app instance would load it.

// next-auth's route handler reads the request's cookies and headers with a CommonJS
// require("next/headers"), which needs Next's request scope (and which vi.mock does not
// reach). For each call, point that module at the request in hand, as Next would.
const nextHeaders = createRequire(import.meta.url)("next/headers") as Record<string, unknown>;
const realScope = { cookies: nextHeaders.cookies, headers: nextHeaders.headers };

async function inRequestScope(req: NextRequest, call: () => Promise<Response>): Promise<Response> {
  nextHeaders.cookies = async () => req.cookies;
  nextHeaders.headers = async () => req.headers;
  try {
    return await call();
  } finally {
    Object.assign(nextHeaders, realScope);
  }
}

type Cookie = { name: string; value: string; attrs: Map<string, string> };

function parseSetCookies(res: Response): Cookie[] {
  return res.headers.getSetCookie().map((line) => {
    const [pair, ...rest] = line.split(";");
    const eq = pair.indexOf("=");
    const attrs = new Map(rest.map((a) => a.trim().split("=")).map(([k, v]) => [k.toLowerCase(), v ?? ""]));
    return { name: pair.slice(0, eq).trim(), value: pair.slice(eq + 1), attrs };
  });
}

async function signInThroughHandler(consoleUrl: string, email: string, password: string) {
  vi.stubEnv("NEXTAUTH_URL", consoleUrl);
  vi.resetModules();
  const { GET, POST } = await import("@/app/api/auth/[...nextauth]/route");
  const params = (...nextauth: string[]) => ({ params: Promise.resolve({ nextauth }) });

  const csrfReq = new NextRequest(`${consoleUrl}/api/auth/csrf`);
  const csrfRes = await inRequestScope(csrfReq, () => GET(csrfReq, params("csrf")));
  expect(csrfRes.status).toBe(200);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const csrfCookie = parseSetCookies(csrfRes).find((c) => c.name.endsWith("next-auth.csrf-token"))!;
  expect(csrfCookie).toBeDefined();

  const body = new URLSearchParams({ csrfToken, email, password, callbackUrl: consoleUrl, json: "true" });
  const signInReq = new NextRequest(`${consoleUrl}/api/auth/callback/credentials`, {
    method: "POST",
    headers: {
      "content-type": "application/x-www-form-urlencoded",
      cookie: `${csrfCookie.name}=${csrfCookie.value}`,
      "x-forwarded-for": `198.51.100.${Math.floor(Math.random() * 250)}`,
    },
    body: body.toString(),
  });
  const res = await inRequestScope(signInReq, () => POST(signInReq, params("callback", "credentials")));
  return { csrfCookie, res, cookies: parseSetCookies(res) };
}

describe("session cookies set by sign-in", () => {
  afterEach(() => {
    vi.unstubAllEnvs();
    vi.resetModules();
  });

  it("over http: HttpOnly, SameSite=Lax, path /, not Secure", async () => {
    const user = await createUser({ password: "cookie-pass-1" });
    const { res, cookies, csrfCookie } = await signInThroughHandler("http://127.0.0.1:3000", user.email, "cookie-pass-1");
    expect(res.status).toBe(200);
    const session = cookies.find((c) => c.name === "next-auth.session-token");
    expect(session, cookies.map((c) => c.name).join(", ")).toBeDefined();
    expect(session!.value.length).toBeGreaterThan(20);
    expect(session!.attrs.has("httponly")).toBe(true);
    expect(session!.attrs.get("samesite")).toBe("Lax");
    expect(session!.attrs.get("path")).toBe("/");
    expect(session!.attrs.has("secure")).toBe(false);
    expect(csrfCookie.name).toBe("next-auth.csrf-token");
    expect(csrfCookie.attrs.has("httponly")).toBe(true);
  });

  it("over https: the __Secure- session cookie, Secure, HttpOnly and SameSite=Lax", async () => {
    const user = await createUser({ password: "cookie-pass-2" });
    const { res, cookies, csrfCookie } = await signInThroughHandler("https://sluice.example.com", user.email, "cookie-pass-2");
    expect(res.status).toBe(200);
    expect(cookies.some((c) => c.name === "next-auth.session-token")).toBe(false);
    const session = cookies.find((c) => c.name === "__Secure-next-auth.session-token");
    expect(session, cookies.map((c) => c.name).join(", ")).toBeDefined();
    expect(session!.attrs.has("secure")).toBe(true);
    expect(session!.attrs.has("httponly")).toBe(true);
    expect(session!.attrs.get("samesite")).toBe("Lax");
    expect(session!.attrs.get("path")).toBe("/");
    // The CSRF cookie is host-only and Secure as well.
    expect(csrfCookie.name).toBe("__Host-next-auth.csrf-token");
    expect(csrfCookie.attrs.has("secure")).toBe(true);
    expect(cookies.every((c) => c.attrs.has("secure") && c.attrs.has("httponly"))).toBe(true);
  });

  it("sets no session cookie for a wrong password", async () => {
    const user = await createUser({ password: "cookie-pass-3" });
    const { cookies } = await signInThroughHandler("http://127.0.0.1:3000", user.email, "not-it");
    expect(cookies.some((c) => c.name.endsWith("next-auth.session-token") && c.value !== "")).toBe(false);
  });
});
