import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { ACTION_ACCESS, ROLES, ROUTE_ACCESS, can, type Role } from "@/lib/permissions";
import type { User } from "@/models";
import { actAs, createUser, ctx, request } from "../factories";
import { ACTION_SAMPLES, GATEWAY_SAMPLES, ROUTE_SAMPLES, makeFixture, releasedGateway, type Fixture } from "./matrix/samples";

// Walks the permissions table (lib/permissions.ts) and calls every route handler and
// server action as signed-out, viewer, engineer, reviewer and admin.

const appDir = path.resolve("app");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

function walk(dir: string, file: string, out: string[] = []): string[] {
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(p, file, out);
    else if (entry.name === file) out.push(p);
  }
  return out;
}

const routeFiles = walk(appDir, "route.ts");
const actionFiles = walk(appDir, "actions.ts");

function routePath(file: string) {
  const segs = path.relative(appDir, path.dirname(file)).split(path.sep).filter((s) => !/^\(.*\)$/.test(s));
  return "/" + segs.join("/");
}

type Discovered = { key: string; handler: (req: Request, c: unknown) => Promise<Response> };

async function discoverRoutes(): Promise<Discovered[]> {
  const out: Discovered[] = [];
  for (const file of routeFiles) {
    const mod = await import(file);
    for (const m of METHODS) if (typeof mod[m] === "function") out.push({ key: `${m} ${routePath(file)}`, handler: mod[m] });
  }
  return out;
}

type Action = (input: unknown) => Promise<{ ok: boolean; status?: number }>;

async function discoverActions(): Promise<{ key: string; fn: Action }[]> {
  const out: { key: string; fn: Action }[] = [];
  for (const file of actionFiles) {
    const mod = await import(file);
    for (const [name, fn] of Object.entries(mod)) {
      if (typeof fn === "function") out.push({ key: `${path.relative(appDir, file).split(path.sep).join("/")}#${name}`, fn: fn as Action });
    }
  }
  return out;
}

const expected = (access: string, role: Role | null) => {
  if (access === "public") return "ok";
  if (access === "gateway") return role === null ? 401 : 401; // console sessions never open the gateway API
  if (role === null) return 401;
  return can(role, access as Parameters<typeof can>[1]) ? "ok" : 403;
};

describe("role matrix", () => {
  let routes: Discovered[];
  let actions: { key: string; fn: Action }[];
  const users = {} as Record<Role, User>;
  let fx: Fixture;

  beforeAll(async () => {
    routes = await discoverRoutes();
    actions = await discoverActions();
    for (const role of ROLES) users[role] = await createUser({ role });
    fx = await makeFixture();
  });

  it("lists every route handler that exists, and nothing that does not", () => {
    const found = routes.map((r) => r.key).sort();
    expect(found).toEqual(Object.keys(ROUTE_ACCESS).sort());
  });

  it("lists every server action that exists, and nothing that does not", () => {
    const found = actions.map((a) => a.key).sort();
    expect(found).toEqual(Object.keys(ACTION_ACCESS).sort());
  });

  it("answers every route as the table says, for every role", async () => {
    let calls = 0;
    for (const { key, handler } of routes) {
      const access = ROUTE_ACCESS[key];
      if (key.includes("/api/auth/")) continue; // next-auth's own endpoints; sign-in is covered in auth.test.ts
      const sample = ROUTE_SAMPLES[key];
      expect(sample, `no sample request for ${key} in tests/integration/matrix/samples.ts`).toBeDefined();
      for (const role of [null, ...ROLES] as (Role | null)[]) {
        const s = await sample(fx);
        const method = key.split(" ")[0];
        const res = await handler(await request(method, s.path, { user: role ? users[role] : null, body: s.body, rawBody: s.rawBody, binaryBody: s.binaryBody }), ctx(s.params ?? {}));
        const want = expected(access, role);
        const label = `${key} as ${role ?? "signed-out"} → ${res.status}`;
        if (want === "ok") expect(res.status, label).toBeLessThan(400);
        else expect(res.status, label).toBe(want);
        if (res.status >= 400) expect((await res.json()).error, label).toEqual(expect.any(String));
        calls++;
      }
    }
    expect(calls).toBeGreaterThan(0);
  });

  it("opens the gateway API to a live gateway token only", async () => {
    const g = await releasedGateway();
    const gatewayRoutes = routes.filter((r) => ROUTE_ACCESS[r.key] === "gateway");
    expect(gatewayRoutes.map((r) => r.key).sort()).toEqual(Object.keys(GATEWAY_SAMPLES).sort());
    const cases: { name: string; headers: Record<string, string>; user?: User; want: number | "ok"; challenge?: RegExp }[] = [
      { name: "no token", headers: {}, want: 401, challenge: /^Bearer realm="sluice"$/ },
      { name: "an admin session", headers: {}, user: users.admin, want: 401, challenge: /^Bearer realm="sluice"$/ },
      { name: "an unknown token", headers: { authorization: `Bearer sgw_${"A".repeat(43)}` }, want: 401, challenge: /error="invalid_token"/ },
      { name: "a revoked token", headers: { authorization: `Bearer ${g.revokedToken}` }, want: 401, challenge: /error="invalid_token"/ },
      { name: "a token in another scheme", headers: { authorization: `Basic ${Buffer.from(`x:${g.token}`).toString("base64")}` }, want: 401, challenge: /error="invalid_token"/ },
      { name: "the live token", headers: { authorization: `Bearer ${g.token}` }, want: "ok" },
    ];
    for (const { key, handler } of gatewayRoutes) {
      for (const c of cases) {
        const s = GATEWAY_SAMPLES[key](g);
        const headers = { "x-forwarded-for": `203.0.113.${gatewayRoutes.indexOf(gatewayRoutes.find((r) => r.key === key)!) * 10 + cases.indexOf(c) + 1}`, ...c.headers };
        const res = await handler(await request(key.split(" ")[0], s.path, { user: c.user ?? null, body: s.body, headers }), undefined);
        const label = `${key} with ${c.name} → ${res.status}`;
        if (c.want === "ok") expect(res.status, label).toBeLessThan(300);
        else {
          expect(res.status, label).toBe(c.want);
          expect(res.headers.get("www-authenticate"), label).toMatch(c.challenge!);
        }
      }
    }
  });

  it("answers every server action as the table says, for every role", async () => {
    for (const { key, fn } of actions) {
      const sample = ACTION_SAMPLES[key];
      expect(sample, `no sample input for ${key} in tests/integration/matrix/samples.ts`).toBeDefined();
      for (const role of [null, ...ROLES] as (Role | null)[]) {
        await actAs(role ? users[role] : null);
        const result = await fn(await sample(fx));
        const want = expected(ACTION_ACCESS[key], role);
        const label = `${key} as ${role ?? "signed-out"} → ${JSON.stringify(result)}`;
        if (want === "ok") expect(result.ok, label).toBe(true);
        else expect(result, label).toMatchObject({ ok: false, status: want });
      }
    }
    await actAs(null);
  });
});
