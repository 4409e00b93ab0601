import { QueryTypes } from "sequelize";
import { describe, expect, it } from "vitest";
import { issueGatewayTokenAction, revokeGatewayTokenAction } from "@/app/(console)/sites/[site]/gateways/[gateway]/actions";
import { GET as listRoute, POST as createRoute } from "@/app/api/sites/[site]/gateways/[gateway]/tokens/route";
import { DELETE as revokeRoute } from "@/app/api/sites/[site]/gateways/[gateway]/tokens/[tokenId]/route";
import { CLI_ACTOR } from "@/lib/audit";
import { listAudit } from "@/lib/data/audit";
import { createGatewayToken, listGatewayTokens, revokeGatewayToken } from "@/lib/data/gateway-tokens";
import { hashToken, TOKEN_PATTERN } from "@/lib/gateway/token";
import type { Role } from "@/lib/permissions";
import { AuditEvent, GatewayToken, sequelize, type User } from "@/models";
import { actAs, createGateway, createGatewayToken as tokenFactory, createSite, createUser, ctx, request } from "../factories";

const actorOf = (u: User) => ({ id: u.id, email: u.email, name: u.name, role: u.role });

async function gatewayAt() {
  const site = await createSite();
  const gateway = await createGateway(site);
  return { site, gateway, params: { site: site.slug, gateway: gateway.slug } };
}

async function issue(user: User, params: { site: string; gateway: string }, body?: unknown, rawBody?: string) {
  return createRoute(await request("POST", `/api/sites/${params.site}/gateways/${params.gateway}/tokens`, { user, body, rawBody }), ctx(params));
}

async function list(user: User, params: { site: string; gateway: string }) {
  return listRoute(await request("GET", `/api/sites/${params.site}/gateways/${params.gateway}/tokens`, { user }), ctx(params));
}

async function revoke(user: User, params: { site: string; gateway: string }, tokenId: string | number) {
  return revokeRoute(await request("DELETE", "/", { user }), ctx({ ...params, tokenId: String(tokenId) }));
}

describe("gateway tokens", () => {
  it("issues a token once: the answer holds it, the database only its SHA-256, the audit log neither", async () => {
    const admin = await createUser({ role: "admin" });
    const { site, gateway, params } = await gatewayAt();
    const res = await issue(admin, params, { label: "  line 2 edge box  " });
    expect(res.status).toBe(201);
    expect(res.headers.get("cache-control")).toBe("no-store");
    const body = await res.json();
    expect(Object.keys(body).sort()).toEqual(["createdAt", "expiresAt", "id", "label", "prefix", "token"]);
    expect(body.expiresAt).toBeNull();
    expect(body.token).toMatch(TOKEN_PATTERN);
    expect(body).toMatchObject({ prefix: body.token.slice(0, 12), label: "line 2 edge box", createdAt: expect.stringMatching(/^\d{4}-\d\d-\d\dT/) });

    const row = await GatewayToken.findByPk(body.id);
    expect(row).toMatchObject({ gatewayId: gateway.id, tokenHash: hashToken(body.token), prefix: body.prefix, createdBy: admin.id, revokedAt: null });
    // Every column of the stored row, as the database has it: no trace of the token.
    const [raw] = await sequelize.query<Record<string, unknown>>("SELECT * FROM gateway_tokens WHERE id = ?", { replacements: [body.id], type: QueryTypes.SELECT });
    expect(raw.token_hash).toBe(hashToken(body.token));
    expect(JSON.stringify(raw)).not.toContain(body.token);
    expect(JSON.stringify(raw)).not.toContain(body.token.slice(12));

    const audit = await AuditEvent.findAll({ where: { entityType: "token", entityId: body.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ action: "token.create", actorId: admin.id, actorEmail: admin.email, siteId: site.id, beforeJson: null });
    expect(audit[0].afterJson).toEqual({ gateway: gateway.slug, prefix: body.prefix, label: "line 2 edge box", state: "live", expiresAt: null });
    const [{ n }] = await sequelize.query<{ n: number }>(
      "SELECT COUNT(*) AS n FROM audit_events WHERE CONCAT_WS(' ', entity_label, before_json, after_json) LIKE ? OR CONCAT_WS(' ', entity_label, before_json, after_json) LIKE ?",
      { replacements: [`%${body.token.slice(12)}%`, `%${hashToken(body.token)}%`], type: QueryTypes.SELECT },
    );
    expect(n).toBe(0);
  });

  it("lists a gateway's tokens by prefix, newest first, never with a hash", async () => {
    const admin = await createUser({ role: "admin", name: "Ada Lister" });
    const { params } = await gatewayAt();
    const first = await (await issue(admin, params, { label: "first" })).json();
    const second = await (await issue(admin, params, {})).json();
    const res = await list(admin, params);
    expect(res.status).toBe(200);
    expect(res.headers.get("cache-control")).toBe("no-store");
    const text = await res.text();
    const { tokens } = JSON.parse(text);
    expect(tokens.map((t: { id: number }) => t.id)).toEqual([second.id, first.id]);
    expect(tokens[1]).toEqual({
      id: first.id,
      prefix: first.prefix,
      label: "first",
      state: "live",
      createdAt: first.createdAt,
      expiresAt: null,
      createdBy: "Ada Lister",
      lastUsedAt: null,
      revokedAt: null,
      revokedBy: null,
    });
    for (const t of [first, second]) {
      expect(text).not.toContain(hashToken(t.token));
      expect(text).not.toContain(t.token);
    }
    expect(text).not.toMatch(/[0-9a-f]{64}/);
    expect(text).not.toMatch(/hash/i);
  });

  it("refuses viewers, engineers and reviewers (tokens are not even readable to them) and signed-out callers", async () => {
    const { gateway, params } = await gatewayAt();
    const existing = await tokenFactory(gateway);
    for (const role of ["viewer", "engineer", "reviewer"] as Role[]) {
      const user = await createUser({ role });
      for (const res of [await list(user, params), await issue(user, params, { label: "x" }), await revoke(user, params, existing.id)]) {
        expect(res.status, role).toBe(403);
        expect(await res.json()).toMatchObject({ error: expect.stringContaining(role) });
      }
      // The data layer refuses on its own too, whoever calls it.
      await expect(listGatewayTokens(actorOf(user), params.site, params.gateway)).rejects.toMatchObject({ status: 403 });
      await actAs(user);
      expect(await issueGatewayTokenAction({ ...params, values: {} })).toMatchObject({ ok: false, status: 403 });
    }
    await actAs(null);
    // A null actor is signed out, never the command line.
    await expect(listGatewayTokens(null, params.site, params.gateway)).rejects.toMatchObject({ status: 401 });
    await expect(createGatewayToken(null, params.site, params.gateway, {})).rejects.toMatchObject({ status: 401 });
    await expect(revokeGatewayToken(null, params.site, params.gateway, existing.id)).rejects.toMatchObject({ status: 401 });
    const signedOut = await listRoute(await request("GET", "/", { user: null }), ctx(params));
    expect(signedOut.status).toBe(401);
    expect(await GatewayToken.count({ where: { gatewayId: gateway.id } })).toBe(1);
    expect((await GatewayToken.findByPk(existing.id))!.revokedAt).toBeNull();
  });

  it("keeps token entries of the audit log from non-admins", async () => {
    const admin = await createUser({ role: "admin" });
    const viewer = await createUser({ role: "viewer" });
    const { site, params } = await gatewayAt();
    await issue(admin, params, { label: "audited" });
    const forAdmin = await listAudit(actorOf(admin), { site: site.slug });
    expect(forAdmin.entries.map((e) => e.action)).toContain("token.create");
    const forViewer = await listAudit(actorOf(viewer), { site: site.slug });
    expect(forViewer.entries.filter((e) => e.entityType === "token")).toEqual([]);
  });

  it("revokes a token once: 200 with the revoked token, then 409 naming the token; audited once", async () => {
    const admin = await createUser({ role: "admin", name: "Ada Revoker" });
    const { gateway, params } = await gatewayAt();
    const issued = await (await issue(admin, params, { label: "old box" })).json();
    const res = await revoke(admin, params, issued.id);
    expect(res.status).toBe(200);
    const revoked = await res.json();
    expect(revoked).toMatchObject({ id: issued.id, prefix: issued.prefix, label: "old box", state: "revoked", revokedBy: "Ada Revoker", revokedAt: expect.any(String) });
    expect(JSON.stringify(revoked)).not.toMatch(/[0-9a-f]{64}/);
    const row = await GatewayToken.findByPk(issued.id);
    expect(row!.revokedAt).not.toBeNull();
    expect(row!.revokedBy).toBe(admin.id);

    const again = await revoke(admin, params, issued.id);
    expect(again.status).toBe(409);
    const refusal = await again.json();
    expect(refusal).toMatchObject({ field: "tokenId" });
    expect(refusal.error).toContain(`${issued.prefix}… was already revoked`);
    expect(refusal.error).toContain("Ada Revoker");
    expect((await GatewayToken.findByPk(issued.id))!.revokedAt!.getTime()).toBe(row!.revokedAt!.getTime());

    const audit = await AuditEvent.findAll({ where: { entityType: "token", entityId: issued.id }, order: [["id", "ASC"]] });
    expect(audit.map((a) => a.action)).toEqual(["token.create", "token.revoke"]);
    expect(audit[1].beforeJson).toMatchObject({ gateway: gateway.slug, state: "live" });
    expect(audit[1].afterJson).toMatchObject({ gateway: gateway.slug, state: "revoked" });
  });

  it("lets only one of two concurrent revocations through", async () => {
    const admin = await createUser({ role: "admin" });
    const { gateway, params } = await gatewayAt();
    const t = await tokenFactory(gateway);
    const answers = await Promise.all([revoke(admin, params, t.id), revoke(admin, params, t.id)]);
    expect(answers.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(await AuditEvent.count({ where: { entityType: "token", entityId: t.id, action: "token.revoke" } })).toBe(1);
  });

  it("rotates: a new token leaves the old one live until it is revoked", async () => {
    const admin = await createUser({ role: "admin" });
    const { params } = await gatewayAt();
    const old = await (await issue(admin, params, { label: "2026 box" })).json();
    const fresh = await (await issue(admin, params, { label: "2027 box" })).json();
    expect(fresh.token).not.toBe(old.token);
    const states = async () => Object.fromEntries(((await (await list(admin, params)).json()).tokens as { id: number; state: string }[]).map((t) => [t.id, t.state]));
    expect(await states()).toEqual({ [old.id]: "live", [fresh.id]: "live" });
    expect((await revoke(admin, params, old.id)).status).toBe(200);
    expect(await states()).toEqual({ [old.id]: "revoked", [fresh.id]: "live" });
  });

  it("gives a token a lifetime in days on request; past it the token shows as expired and can still be revoked", async () => {
    const admin = await createUser({ role: "admin" });
    const { gateway, params } = await gatewayAt();
    const t0 = Date.now();
    const res = await issue(admin, params, { label: "short-lived", expiresInDays: 30 });
    expect(res.status).toBe(201);
    const body = await res.json();
    const expires = Date.parse(body.expiresAt);
    expect(expires - t0).toBeGreaterThanOrEqual(30 * 86_400_000 - 1_000);
    expect(expires - Date.now()).toBeLessThanOrEqual(30 * 86_400_000);
    expect((await GatewayToken.findByPk(body.id))!.expiresAt!.getTime()).toBe(expires);
    // The limits themselves are legal; null is "until revoked".
    expect((await (await issue(admin, params, { expiresInDays: 3650 })).json()).expiresAt).toMatch(/^\d{4}-/);
    expect((await (await issue(admin, params, { expiresInDays: 1 })).json()).expiresAt).toMatch(/^\d{4}-/);
    expect((await (await issue(admin, params, { expiresInDays: null })).json()).expiresAt).toBeNull();

    await GatewayToken.update({ expiresAt: new Date(Date.now() - 60_000) }, { where: { id: body.id } });
    const view = (await (await list(admin, params)).json()).tokens.find((t: { id: number }) => t.id === body.id);
    expect(view).toMatchObject({ state: "expired", expiresAt: expect.stringMatching(/^\d{4}-/) });
    const revoked = await revoke(admin, params, body.id);
    expect(revoked.status).toBe(200);
    expect((await revoked.json()).state).toBe("revoked");
    expect(await GatewayToken.count({ where: { gatewayId: gateway.id } })).toBe(4);
  });

  it("names the field of bad input and changes nothing", async () => {
    const admin = await createUser({ role: "admin" });
    const { gateway, params } = await gatewayAt();
    const cases: [unknown, string][] = [
      [{ label: "x".repeat(121) }, "label"],
      [{ label: 42 }, "label"],
      [{ label: "two\nlines" }, "label"],
      [{ label: "ok", gateway: "other" }, "body"],
      [["label"], "body"],
      [{ expiresInDays: 0 }, "expiresInDays"],
      [{ expiresInDays: 3651 }, "expiresInDays"],
      [{ expiresInDays: 1.5 }, "expiresInDays"],
      [{ expiresInDays: "30" }, "expiresInDays"],
      [{ expiresInDays: true }, "expiresInDays"],
    ];
    for (const [body, field] of cases) {
      const res = await issue(admin, params, body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(await res.json(), JSON.stringify(body)).toMatchObject({ field, error: expect.any(String) });
    }
    const tooLong = await (await issue(admin, params, { label: "x".repeat(121) })).json();
    expect(tooLong.error).toContain("120");
    const notJson = await issue(admin, params, undefined, "{label:");
    expect(notJson.status).toBe(400);
    expect(await notJson.json()).toMatchObject({ field: "body" });
    expect(await GatewayToken.count({ where: { gatewayId: gateway.id } })).toBe(0);

    // An empty body is fine: an unlabelled token. 120 characters is the limit, not past it.
    const empty = await issue(admin, params, undefined);
    expect(empty.status).toBe(201);
    expect((await empty.json()).label).toBe("");
    expect((await issue(admin, params, { label: "é".repeat(120) })).status).toBe(201);

    for (const bad of ["abc", "0", "-3", "1.5"]) {
      const res = await revoke(admin, params, bad);
      expect(res.status, bad).toBe(422);
      expect(await res.json(), bad).toMatchObject({ field: "tokenId" });
    }
    const missing = await revoke(admin, params, 2_000_000_000);
    expect(missing.status).toBe(404);
    expect(await missing.json()).toMatchObject({ field: "tokenId" });
  });

  it("answers 404 for an unknown site or gateway, and for a token of another gateway", async () => {
    const admin = await createUser({ role: "admin" });
    const { site, params } = await gatewayAt();
    const other = await createGateway(site);
    const elsewhere = await tokenFactory(other);
    for (const p of [{ ...params, gateway: "no-such-gateway" }, { site: "no-such-site", gateway: params.gateway }]) {
      const field = p.site === "no-such-site" ? "site" : "gateway";
      for (const res of [await list(admin, p), await issue(admin, p, { label: "x" }), await revoke(admin, p, elsewhere.id)]) {
        expect(res.status).toBe(404);
        expect(await res.json()).toMatchObject({ field, error: expect.stringContaining(field === "site" ? "no-such-site" : "no-such-gateway") });
      }
    }
    // A gateway of the same site with the same admin: its tokens are not reachable through this one.
    const cross = await revoke(admin, params, elsewhere.id);
    expect(cross.status).toBe(404);
    expect(await cross.json()).toMatchObject({ field: "tokenId" });
    expect((await GatewayToken.findByPk(elsewhere.id))!.revokedAt).toBeNull();
  });

  it("issues and revokes through the console's server actions", async () => {
    const admin = await createUser({ role: "admin" });
    const { params } = await gatewayAt();
    await actAs(admin);
    const issued = await issueGatewayTokenAction({ ...params, values: { label: "from the console" } });
    expect(issued.ok).toBe(true);
    if (!issued.ok) return;
    expect(issued.data.token).toMatch(TOKEN_PATTERN);
    const bad = await issueGatewayTokenAction({ ...params, values: { label: "y".repeat(200) } });
    expect(bad).toMatchObject({ ok: false, status: 422, field: "label" });
    expect(await revokeGatewayTokenAction({ ...params, tokenId: issued.data.id })).toMatchObject({ ok: true, data: { state: "revoked" } });
    expect(await revokeGatewayTokenAction({ ...params, tokenId: issued.data.id })).toMatchObject({ ok: false, status: 409, field: "tokenId" });
    await actAs(null);
  });

  it("audits the command line as (cli), with no user behind the token", async () => {
    const { site, params } = await gatewayAt();
    const issued = await createGatewayToken(CLI_ACTOR, params.site, params.gateway, { label: "automation" });
    expect(issued.token).toMatch(TOKEN_PATTERN);
    const revoked = await revokeGatewayToken(CLI_ACTOR, params.site, params.gateway, issued.id);
    expect(revoked).toMatchObject({ createdBy: "command line", revokedBy: "command line", state: "revoked" });
    const row = await GatewayToken.findByPk(issued.id);
    expect(row).toMatchObject({ createdBy: null, revokedBy: null });
    const audit = await AuditEvent.findAll({ where: { entityType: "token", entityId: issued.id }, order: [["id", "ASC"]] });
    expect(audit.map((a) => [a.action, a.actorId, a.actorEmail, a.siteId])).toEqual([
      ["token.create", null, "(cli)", site.id],
      ["token.revoke", null, "(cli)", site.id],
    ]);
  });
});
