import "server-only";
import type { Transaction } from "sequelize";
import { isSystemActor, recordAudit, type SystemActor } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { generateToken } from "@/lib/gateway/token";
import { HttpError } from "@/lib/http";
import { Gateway, GatewayToken, User, sequelize, type Site } from "@/models";
import { issueTokenSchema, tokenRefSchema, type IssueTokenInput } from "@/schemas/gateway-token";
import { assertCan } from "./access";
import { siteBySlug } from "./sites";

/** Who manages tokens: a signed-in admin, or the command line (passed explicitly; null means signed out). */
export type TokenActor = Actor | SystemActor;

/** A gateway token as people see it: never the token, never its hash. */
export type GatewayTokenView = {
  id: number;
  prefix: string;
  label: string;
  state: "live" | "expired" | "revoked";
  createdAt: string;
  /** When the gateway API stops taking it; null: not before it is revoked. */
  expiresAt: string | null;
  /** The admin's name, or "command line". */
  createdBy: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  revokedBy: string | null;
};

/** The answer to issuing a token: the only time the token itself leaves the registry. */
export type IssuedToken = { id: number; token: string; prefix: string; label: string; createdAt: string; expiresAt: string | null };

const BY_CLI = "command line";

/** Tokens are for admins only, also for reading (DESIGN.md "Roles": everyone reads everything except tokens and users). */
function assertTokenAdmin(actor: TokenActor | null): asserts actor is TokenActor {
  if (actor && isSystemActor(actor)) return;
  assertCan(actor, "fleet.admin");
}

const userIdOf = (actor: TokenActor) => (isSystemActor(actor) ? null : actor.id);

async function gatewayOf(siteSlug: string, gatewaySlug: string, transaction?: Transaction): Promise<{ site: Site; gateway: Gateway }> {
  const site = await siteBySlug(siteSlug, transaction);
  const gateway = await Gateway.findOne({ where: { siteId: site.id, slug: gatewaySlug }, transaction });
  if (!gateway) throw new HttpError(404, `no gateway "${gatewaySlug}" at site "${site.slug}"`, "gateway");
  return { site, gateway };
}

async function namesOf(ids: (number | null)[], transaction?: Transaction): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((id): id is number => id !== null))];
  if (wanted.length === 0) return new Map();
  const users = await User.findAll({ where: { id: wanted }, attributes: ["id", "name"], transaction });
  return new Map(users.map((u) => [u.id, u.name]));
}

/** Revoked wins over expired: a revoked token stays revoked whatever its date. */
function stateOf(t: GatewayToken, now = Date.now()): GatewayTokenView["state"] {
  if (t.revokedAt) return "revoked";
  return t.expiresAt && t.expiresAt.getTime() <= now ? "expired" : "live";
}

function present(t: GatewayToken, names: Map<number, string>): GatewayTokenView {
  const who = (id: number | null) => (id === null ? BY_CLI : (names.get(id) ?? `user ${id}`));
  return {
    id: t.id,
    prefix: t.prefix,
    label: t.label,
    state: stateOf(t),
    createdAt: t.createdAt.toISOString(),
    expiresAt: t.expiresAt?.toISOString() ?? null,
    createdBy: who(t.createdBy),
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
    revokedAt: t.revokedAt?.toISOString() ?? null,
    revokedBy: t.revokedAt ? who(t.revokedBy ?? null) : null,
  };
}

// What the audit log keeps of a token: enough to tell it apart, nothing that authenticates.
const snapshot = (t: GatewayToken, gateway: Gateway) => ({
  gateway: gateway.slug,
  prefix: t.prefix,
  label: t.label,
  state: stateOf(t),
  expiresAt: t.expiresAt?.toISOString() ?? null,
});

const auditLabel = (t: GatewayToken, gateway: Gateway) => `${gateway.slug} ${t.prefix}…`;

/**
 * Issues a token for a gateway. The token (DESIGN.md "Gateway API": 256 bits from the
 * CSPRNG, lib/gateway/token.ts) is in the answer only; the database keeps its SHA-256.
 * Earlier tokens stay live, so a rotation is: issue, deploy, then revoke the old one.
 */
export async function createGatewayToken(actor: TokenActor | null, siteSlug: string, gatewaySlug: string, input: IssueTokenInput): Promise<IssuedToken> {
  assertTokenAdmin(actor);
  const { label, expiresInDays } = issueTokenSchema.parse(input ?? {});
  const { token, hash, prefix } = generateToken();
  const expiresAt = expiresInDays === null ? null : new Date(Date.now() + expiresInDays * 86_400_000);
  return sequelize.transaction(async (transaction) => {
    const { site, gateway } = await gatewayOf(siteSlug, gatewaySlug, transaction);
    const row = await GatewayToken.create({ gatewayId: gateway.id, tokenHash: hash, prefix, label, expiresAt, createdBy: userIdOf(actor) }, { transaction });
    await recordAudit(
      actor,
      { action: "token.create", entityType: "token", entityId: row.id, entityLabel: auditLabel(row, gateway), siteId: site.id, before: null, after: snapshot(row, gateway) },
      transaction,
    );
    return { id: row.id, token, prefix, label, createdAt: row.createdAt.toISOString(), expiresAt: expiresAt?.toISOString() ?? null };
  });
}

/** A gateway's tokens, newest first, live and revoked. */
export async function listGatewayTokens(actor: TokenActor | null, siteSlug: string, gatewaySlug: string): Promise<GatewayTokenView[]> {
  assertTokenAdmin(actor);
  const { gateway } = await gatewayOf(siteSlug, gatewaySlug);
  const rows = await GatewayToken.findAll({
    where: { gatewayId: gateway.id },
    attributes: { exclude: ["tokenHash"] },
    order: [["createdAt", "DESC"], ["id", "DESC"]],
  });
  const names = await namesOf(rows.flatMap((r) => [r.createdBy, r.revokedBy ?? null]));
  return rows.map((r) => present(r, names));
}

/**
 * Revokes one token of a gateway; the gateway API refuses it from the next request on.
 * Revoking a token that is already revoked is refused (409) and changes nothing.
 */
export async function revokeGatewayToken(actor: TokenActor | null, siteSlug: string, gatewaySlug: string, tokenId: number | string): Promise<GatewayTokenView> {
  assertTokenAdmin(actor);
  const { tokenId: id } = tokenRefSchema.parse({ tokenId });
  return sequelize.transaction(async (transaction) => {
    const { site, gateway } = await gatewayOf(siteSlug, gatewaySlug, transaction);
    const row = await GatewayToken.findOne({
      where: { id, gatewayId: gateway.id },
      attributes: { exclude: ["tokenHash"] },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!row) throw new HttpError(404, `gateway "${gateway.slug}" has no token with id ${id}`, "tokenId");
    if (row.revokedAt) {
      const by = present(row, await namesOf([row.revokedBy ?? null], transaction)).revokedBy;
      throw new HttpError(409, `token ${row.prefix}… was already revoked on ${row.revokedAt.toISOString()} by ${by}`, "tokenId");
    }
    const before = snapshot(row, gateway);
    await row.update({ revokedAt: new Date(), revokedBy: userIdOf(actor) }, { transaction });
    await recordAudit(
      actor,
      { action: "token.revoke", entityType: "token", entityId: row.id, entityLabel: auditLabel(row, gateway), siteId: site.id, before, after: snapshot(row, gateway) },
      transaction,
    );
    return present(row, await namesOf([row.createdBy, row.revokedBy ?? null], transaction));
  });
}
