import { randomUUID } from "node:crypto";
import { compactVerify, decodeProtectedHeader, importSPKI } from "jose";
import { describe, expect, it } from "vitest";
import { GET as pullRoute } from "@/app/api/gateway/v1/bundle/route";
import { PUT as checkInRoute } from "@/app/api/gateway/v1/check-in/route";
import { GET as keysRoute } from "@/app/api/gateway/v1/signing-key/route";
import { digestHex } from "@/lib/bundles/digest";
import { verifyBytes } from "@/lib/bundles/signing";
import { createSequelize } from "@/lib/db";
import { publishRelease } from "@/lib/data/releases";
import { signingKeys } from "@/lib/data/signing-keys";
import { loadWorkingConfig } from "@/lib/data/groups";
import { errorResponse } from "@/lib/http";
import { Gateway, GatewayReport, GatewayToken, Site, sequelize } from "@/models";
import { createGateway, createGatewayToken, createGroup, createSite, createTag, createUser, request } from "../factories";

// The gateway API (DESIGN.md "Gateway API (contract)"), called as the route handlers.

async function plant() {
  const site = await createSite();
  const a = await createGateway(site, { slug: `gw-a-${site.id}` });
  const b = await createGateway(site, { slug: `gw-b-${site.id}` });
  await createTag(site, a, { name: "PAST1/TT-101/PV" });
  await createTag(site, b, { name: "PAST1/TT-102/PV" });
  await createGroup(site, { name: "pasteuriser", patterns: ["PAST1/*"] });
  return { site, a, b };
}

async function release(site: Site, config?: object) {
  const admin = await createUser({ role: "admin" });
  const actor = { id: admin.id, email: admin.email, name: admin.name, role: "admin" as const };
  const cfg = config ?? (await loadWorkingConfig(site.id));
  return sequelize.transaction((t) => publishRelease(site, cfg as never, { changeId: null, actor }, t));
}

// Each call from an address of its own (RFC 5737 documentation range) unless a test picks one, so the
// per-address throttle of one test does not answer 429 in another.
let calls = 0;
const address = () => `192.0.2.${(calls++ % 250) + 1}, 10.0.0.${Math.floor(calls / 250) % 250}`;
const pull = (token: string | null, headers: Record<string, string> = {}, path = "/api/gateway/v1/bundle") =>
  request("GET", path, { headers: { "x-forwarded-for": address(), ...(token !== null ? { authorization: `Bearer ${token}` } : {}), ...headers } }).then((r) => pullRoute(r, undefined));

const checkIn = (token: string, body: unknown) => request("PUT", "/api/gateway/v1/check-in", { headers: { authorization: `Bearer ${token}` }, body }).then((r) => checkInRoute(r, undefined));

async function released() {
  const p = await plant();
  await release(p.site);
  const ta = await createGatewayToken(p.a);
  const tb = await createGatewayToken(p.b);
  return { ...p, ta: ta.token, tb: tb.token, taId: ta.id };
}

const report = (release: number, digest: string, over: Record<string, unknown> = {}) => ({
  report: randomUUID(),
  release,
  digest,
  status: "running",
  appliedAt: "2026-12-01T10:00:00Z",
  pointsIn: 6000,
  pointsOut: 400,
  from: "2026-12-01T10:00:00Z",
  to: "2026-12-01T10:01:00Z",
  ...over,
});

describe("GET /api/gateway/v1/bundle", () => {
  it("serves the gateway's exact bundle with digest ETag, release, signature and a verifiable freshness statement", async () => {
    const { site, a, ta } = await released();
    const res = await pull(ta);
    expect(res.status).toBe(200);
    const bytes = Buffer.from(await res.arrayBuffer());
    expect(res.headers.get("content-type")).toMatch(/^application\/yaml/);
    expect(res.headers.get("etag")).toBe(`"${digestHex(bytes)}"`);
    expect(res.headers.get("cache-control")).toBe("private, no-cache");
    expect(res.headers.get("bundle-release")).toBe("1");
    expect(bytes.toString("utf8")).toContain(`gateway: ${a.slug}`);
    expect(bytes.toString("utf8")).toContain(`site: ${site.slug}`);
    // Bundle-Signature: Ed25519 (RFC 8032) over the exact bytes, with the key id.
    const m = /^key=([A-Za-z0-9._-]+), ed25519=([A-Za-z0-9+/=]+)$/.exec(res.headers.get("bundle-signature") ?? "");
    expect(m).not.toBeNull();
    const key = signingKeys().keys.find((k) => k.id === m![1])!;
    expect(verifyBytes(key.publicKeyPem, bytes, m![2])).toBe(true);
    expect(verifyBytes(key.publicKeyPem, Buffer.concat([bytes, Buffer.from(" ")]), m![2])).toBe(false);
    // Bundle-Freshness: JWS compact (RFC 7515), EdDSA (RFC 8037), kid = the key id.
    const jws = res.headers.get("bundle-freshness")!;
    expect(decodeProtectedHeader(jws)).toEqual({ alg: "EdDSA", kid: key.id });
    const { payload } = await compactVerify(jws, await importSPKI(key.publicKeyPem, "EdDSA"));
    const claims = JSON.parse(new TextDecoder().decode(payload));
    expect(claims).toMatchObject({ gateway: a.slug, release: 1, digest: digestHex(bytes) });
    expect(Math.abs(claims.iat - Date.now() / 1000)).toBeLessThan(5);
    expect(claims.exp).toBeGreaterThan(claims.iat);
  });

  it("answers If-None-Match per RFC 9110 §13.1.2: match, mismatch, *, a weak tag and a list", async () => {
    const { ta } = await released();
    const first = await pull(ta);
    const etag = first.headers.get("etag")!;
    const hex = etag.slice(1, -1);
    for (const field of [etag, "*", `W/${etag}`, `"nope", ${etag}`, ` W/"other" , W/${etag} `]) {
      const res = await pull(ta, { "if-none-match": field });
      expect(res.status, field).toBe(304);
      expect(await res.text(), field).toBe("");
      expect(res.headers.get("etag")).toBe(etag);
      expect(res.headers.get("cache-control")).toBe("private, no-cache");
      expect(Math.abs(Date.parse(res.headers.get("date")!) - Date.now())).toBeLessThan(5000);
      expect(res.headers.get("bundle-freshness")).toMatch(/^[\w-]+\.[\w-]+\.[\w-]+$/);
    }
    const other = hex.slice(0, -1) + (hex.endsWith("0") ? "1" : "0");
    for (const field of [`"${other}"`, `"${hex}-gzip"`, hex, "W/", ""]) {
      const res = await pull(ta, { "if-none-match": field });
      expect(res.status, field).toBe(200);
    }
  });

  it("sends the exact bytes uncompressed with the identity ETag, whatever the client accepts", async () => {
    const { ta } = await released();
    const plain = await pull(ta);
    const bytes = Buffer.from(await plain.arrayBuffer());
    const res = await pull(ta, { "accept-encoding": "gzip, deflate, br" });
    expect(res.headers.get("content-encoding")).toBeNull();
    expect(res.headers.get("etag")).toBe(`"${digestHex(bytes)}"`);
    expect(Buffer.from(await res.arrayBuffer()).equals(bytes)).toBe(true);
  });

  it("refuses an expired token like a revoked one, from the moment it expires", async () => {
    const { ta, taId, tb } = await released();
    expect((await pull(ta)).status).toBe(200);
    // Still a second to go: taken.
    await GatewayToken.update({ expiresAt: new Date(Date.now() + 1_000) }, { where: { id: taId } });
    expect((await pull(ta)).status).toBe(200);
    await GatewayToken.update({ expiresAt: new Date(Date.now() - 1) }, { where: { id: taId } });
    const expired = await pull(ta);
    expect(expired.status).toBe(401);
    expect(expired.headers.get("www-authenticate")).toMatch(/^Bearer realm="sluice", error="invalid_token"/);
    expect((await expired.json()).error).toMatch(/expired/);
    // The other gateway's token, without an expiry, is untouched.
    expect((await pull(tb)).status).toBe(200);
  });

  it("authenticates before preconditions, with RFC 6750 challenges", async () => {
    const { ta } = await released();
    const etag = (await pull(ta)).headers.get("etag")!;
    const none = await pull(null, { "if-none-match": etag });
    expect(none.status).toBe(401);
    expect(none.headers.get("www-authenticate")).toBe('Bearer realm="sluice"');
    expect((await none.json()).error).toMatch(/token/);
    const bad = await pull(`sgw_${"B".repeat(43)}`, { "if-none-match": etag });
    expect(bad.status).toBe(401);
    expect(bad.headers.get("www-authenticate")).toMatch(/^Bearer realm="sluice", error="invalid_token"/);
    // A token in the URL is never accepted.
    const inUrl = await pull(null, {}, `/api/gateway/v1/bundle?access_token=${ta}`);
    expect(inUrl.status).toBe(401);
    expect(inUrl.headers.get("www-authenticate")).toBe('Bearer realm="sluice"');
  });

  it("answers 404 with a JSON error while no release holds a bundle for the gateway", async () => {
    const { a } = await plant();
    const { token } = await createGatewayToken(a);
    const res = await pull(token);
    expect(res.status).toBe(404);
    expect(await res.json()).toMatchObject({ field: "release" });
  });

  it("gives each token its own gateway's bundle and no way to ask for another", async () => {
    const { a, b, ta, tb } = await released();
    const ya = await (await pull(ta)).text();
    const yb = await (await pull(tb)).text();
    expect(ya).toContain(`gateway: ${a.slug}`);
    expect(yb).toContain(`gateway: ${b.slug}`);
    expect(await (await pull(ta, {}, `/api/gateway/v1/bundle?gateway=${b.slug}`)).text()).toBe(ya);
  });

  it("serves a new release on the next pull (no cache delays it)", async () => {
    const { site, ta } = await released();
    const etag1 = (await pull(ta)).headers.get("etag")!;
    await release(site, { groups: [] });
    const res = await pull(ta, { "if-none-match": etag1 });
    expect(res.status).toBe(200);
    expect(res.headers.get("bundle-release")).toBe("2");
    expect(res.headers.get("etag")).not.toBe(etag1);
  });

  it("refuses a revoked token on the next request, also while 50 clients are pulling", async () => {
    const { ta, taId } = await released();
    let revokedAt = 0;
    const results: { started: number; status: number }[] = [];
    const client = async () => {
      for (let i = 0; i < 12; i++) {
        const started = performance.now();
        const res = await pull(ta);
        results.push({ started, status: res.status });
        await res.arrayBuffer();
      }
    };
    const revoke = (async () => {
      await new Promise((r) => setTimeout(r, 150));
      await GatewayToken.update({ revokedAt: new Date() }, { where: { id: taId } });
      revokedAt = performance.now();
    })();
    await Promise.all([...Array.from({ length: 50 }, client), revoke]);
    expect(revokedAt).toBeGreaterThan(0);
    const before = results.filter((r) => r.started < revokedAt);
    const after = results.filter((r) => r.started > revokedAt);
    expect(before.length).toBeGreaterThan(0);
    expect(after.length).toBeGreaterThan(0);
    expect(after.every((r) => r.status === 401 || r.status === 429)).toBe(true);
    expect(before.some((r) => r.status === 200)).toBe(true);
  }, 60_000);

  it("slows a failing token down: 429 with Retry-After after repeated failures", async () => {
    const token = `sgw_${randomUUID().replace(/-/g, "").padEnd(43, "x")}`;
    const statuses: number[] = [];
    let retryAfter: string | null = null;
    for (let i = 0; i < 8; i++) {
      const res = await pull(token, { "x-forwarded-for": `198.51.100.${(i % 200) + 1}` });
      statuses.push(res.status);
      if (res.status === 429) retryAfter = res.headers.get("retry-after");
    }
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    expect(statuses).toContain(429);
    expect(Number(retryAfter)).toBeGreaterThanOrEqual(1);
  });

  it("answers 503 with Retry-After, not a stack trace, when the database is unreachable", async () => {
    const down = createSequelize("mariadb://nobody:x@127.0.0.1:1/none");
    const err = await down.query("SELECT 1").catch((e: unknown) => e);
    await down.close();
    const res = errorResponse(err);
    expect(res.status).toBe(503);
    expect(res.headers.get("retry-after")).toBe("5");
    expect(JSON.stringify(await res.json())).not.toMatch(/at .*\.js|127\.0\.0\.1:1/);
  });
});

describe("the pull's one query", () => {
  it("reads token → gateway → bundle → release through unique keys only (EXPLAIN shows no scan)", async () => {
    const { ta } = await released();
    const { PULL_SQL } = await import("@/lib/data/gateway-auth");
    const { hashToken } = await import("@/lib/gateway/token");
    const { QueryTypes } = await import("sequelize");
    const plan = await sequelize.query<{ table: string; type: string; key: string | null }>(`EXPLAIN ${PULL_SQL}`, { replacements: [hashToken(ta), new Date()], type: QueryTypes.SELECT });
    expect(plan).toHaveLength(4);
    for (const row of plan) {
      expect(["const", "eq_ref"], JSON.stringify(row)).toContain(row.type);
      expect(row.key, JSON.stringify(row)).toBeTruthy();
    }
  });
});

describe("GET /api/gateway/v1/signing-key", () => {
  it("lists the public keys without private parts", async () => {
    const { ta } = await released();
    const res = await keysRoute(await request("GET", "/api/gateway/v1/signing-key", { headers: { authorization: `Bearer ${ta}` } }), undefined);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.keys.map((k: { id: string }) => k.id)).toEqual(signingKeys().keys.map((k) => k.id));
    expect(JSON.stringify(body)).not.toMatch(/PRIVATE KEY/);
    expect(body.keys[0].publicKey).toMatch(/^-----BEGIN PUBLIC KEY-----/);
  });
});

describe("PUT /api/gateway/v1/check-in", () => {
  async function current(ta: string) {
    const res = await pull(ta);
    return { release: Number(res.headers.get("bundle-release")), digest: res.headers.get("etag")!.slice(1, -1) };
  }

  it("records what the gateway runs; the same report id twice changes nothing", async () => {
    const { a, ta } = await released();
    const { release: n, digest } = await current(ta);
    const r = report(n, digest, { unknownTags: ["PAST1/FT-900/PV", "PAST1/FT-900/PV"] });
    expect((await checkIn(ta, r)).status).toBe(204);
    const g = await Gateway.findByPk(a.id);
    expect(g).toMatchObject({ runningRelease: n, runningDigest: digest, lastStatus: "running", unknownTags: ["PAST1/FT-900/PV"] });
    expect((await checkIn(ta, { ...r, pointsIn: 1, pointsOut: 1, status: "failed", message: "again" })).status).toBe(204);
    const rows = await GatewayReport.findAll({ where: { gatewayId: a.id } });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ pointsIn: 6000, pointsOut: 400, status: "running" });
    expect((await Gateway.findByPk(a.id))!.lastStatus).toBe("running");
  });

  it("records and flags a report of a lower release than the last running one", async () => {
    const { site, a, ta } = await released();
    const one = await current(ta);
    await release(site, { groups: [] });
    const two = await current(ta);
    expect(two.release).toBe(2);
    expect((await checkIn(ta, report(2, two.digest, { from: "2026-12-01T10:00:00Z", to: "2026-12-01T10:01:00Z" }))).status).toBe(204);
    expect((await checkIn(ta, report(1, one.digest, { from: "2026-12-01T10:01:00Z", to: "2026-12-01T10:02:00Z" }))).status).toBe(204);
    const g = await Gateway.findByPk(a.id);
    expect(g).toMatchObject({ runningRelease: 1, lowerReleaseReported: 1 });
    const flagged = await GatewayReport.findAll({ where: { gatewayId: a.id, lowerRelease: true } });
    expect(flagged.map((f) => f.release)).toEqual([1]);
    // Running the target again clears the flag.
    await checkIn(ta, report(2, two.digest, { from: "2026-12-01T10:02:00Z", to: "2026-12-01T10:03:00Z" }));
    expect((await Gateway.findByPk(a.id))!.lowerReleaseReported).toBeNull();
  });

  it("keeps a late report in the history without turning the status back", async () => {
    const { a, ta } = await released();
    const { release: n, digest } = await current(ta);
    await checkIn(ta, report(n, digest, { from: "2026-12-01T11:00:00Z", to: "2026-12-01T11:01:00Z" }));
    await checkIn(ta, report(n, digest, { status: "failed", message: "old failure", from: "2026-12-01T09:00:00Z", to: "2026-12-01T09:01:00Z" }));
    expect(await GatewayReport.count({ where: { gatewayId: a.id } })).toBe(2);
    expect((await Gateway.findByPk(a.id))!.lastStatus).toBe("running");
  });

  it("records a failure with its message and when it began", async () => {
    const { a, ta } = await released();
    const { release: n, digest } = await current(ta);
    await checkIn(ta, report(n, digest, { status: "failed", message: "step 2: deviation must be positive" }));
    const g = await Gateway.findByPk(a.id);
    expect(g).toMatchObject({ lastStatus: "failed", lastMessage: "step 2: deviation must be positive", runningRelease: null });
    expect(g!.failingSince).toBeInstanceOf(Date);
  });

  it("refuses bad reports with the field named, and an oversized body with 413", async () => {
    const { ta } = await released();
    const { release: n, digest } = await current(ta);
    const cases: [unknown, string][] = [
      [report(n, digest, { report: "not-a-uuid" }), "report"],
      [report(n, "0".repeat(64)), "digest"],
      [report(n + 5, digest), "release"],
      [report(n, digest, { status: "sleeping" }), "status"],
      [report(n, digest, { pointsIn: -1 }), "pointsIn"],
      [report(n, digest, { pointsOut: 1e300 }), "pointsOut"],
      [report(n, digest, { from: "2026-12-01T12:00:00Z" }), "from"],
      [report(n, digest, { appliedAt: "yesterday" }), "appliedAt"],
      [report(n, digest, { unknownTags: [""] }), "unknownTags.0"],
      [{ ...report(n, digest), extra: 1 }, "body"],
    ];
    for (const [body, field] of cases) {
      const res = await checkIn(ta, body);
      expect(res.status, field).toBe(422);
      expect((await res.json()).field, JSON.stringify(body)).toBe(field);
    }
    const raw = await checkInRoute(await request("PUT", "/api/gateway/v1/check-in", { headers: { authorization: `Bearer ${ta}` }, rawBody: "{not json" }), undefined);
    expect(raw.status).toBe(400);
    const huge = report(n, digest, { message: "x".repeat(300 * 1024) });
    const res = await checkIn(ta, huge);
    expect(res.status).toBe(413);
    expect((await res.json()).field).toBe("body");
  });
});
