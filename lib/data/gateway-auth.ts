import "server-only";
import { QueryTypes } from "sequelize";
import { recordFailure, waitSeconds, type ThrottleRule } from "@/lib/auth/throttle";
import { bearerToken, hashToken, TOKEN_PATTERN } from "@/lib/gateway/token";
import { HttpError } from "@/lib/http";
import { sequelize } from "@/models";

/** What one indexed read tells a gateway request: who it is and what it should run. */
export type GatewayPull = {
  tokenId: number;
  gatewayId: number;
  gateway: string;
  siteId: number;
  pollSeconds: number;
  bundleId: number | null;
  digest: string | null;
  keyId: string | null;
  signature: string | null;
  release: number | null;
};

const REALM = 'Bearer realm="sluice"';

/** RFC 6750 §3: no credentials → a bare challenge; bad credentials → `error="invalid_token"`. */
export const noToken = () => new HttpError(401, "a gateway token is required (Authorization: Bearer …)", "authorization", { "WWW-Authenticate": REALM });
const badToken = () =>
  new HttpError(401, "the gateway token is unknown, expired or revoked", "authorization", {
    "WWW-Authenticate": `${REALM}, error="invalid_token", error_description="the token is unknown, expired or revoked"`,
  });

// A failing token is slowed down; so is an address that keeps presenting failing tokens.
const TOKEN_RULES: readonly ThrottleRule[] = [
  { prefix: "gwtok", free: 5, capSeconds: 300 },
  { prefix: "gwaddr", free: 20, capSeconds: 60 },
];

/** The token → gateway → current bundle lookup: one query over primary keys and the unique token hash. */
export const PULL_SQL = `SELECT t.id AS tokenId, g.id AS gatewayId, g.slug AS gateway, g.site_id AS siteId, g.poll_seconds AS pollSeconds,
         b.id AS bundleId, b.digest, b.key_id AS keyId, b.signature, r.number AS \`release\`
    FROM gateway_tokens t
    JOIN gateways g ON g.id = t.gateway_id
    LEFT JOIN bundles b ON b.id = g.current_bundle_id
    LEFT JOIN releases r ON r.id = b.release_id
   WHERE t.token_hash = ? AND t.revoked_at IS NULL AND (t.expires_at IS NULL OR t.expires_at > ?)`;

/**
 * Authenticates a gateway request (before any precondition, RFC 9110 §13.2.1): the bearer
 * token from the Authorization header only (never from the URL), looked up by its SHA-256
 * with no cache, so a revocation holds from the next request on. A failing token is
 * counted; once it or its address has failed too often, the answer is 429 with
 * Retry-After instead of 401.
 */
export async function authenticateGateway(req: Request): Promise<GatewayPull> {
  const token = bearerToken(req.headers.get("authorization"));
  if (token === null) throw noToken();
  const hash = hashToken(token);
  if (TOKEN_PATTERN.test(token)) {
    const rows = await sequelize.query<GatewayPull>(PULL_SQL, { replacements: [hash, new Date()], type: QueryTypes.SELECT });
    if (rows.length === 1) return rows[0];
  }
  const keys = [`gwtok:${hash}`, `gwaddr:${clientAddress(req)}`];
  const wait = await waitSeconds(keys);
  if (wait > 0) throw new HttpError(429, `too many failed attempts with this token or from this address; try again in ${wait} s`, "authorization", { "Retry-After": String(wait) });
  await recordFailure(keys, new Date(), TOKEN_RULES);
  throw badToken();
}

function clientAddress(req: Request): string {
  const fwd = req.headers.get("x-forwarded-for");
  return (fwd?.split(",")[0]?.trim() || req.headers.get("x-real-ip") || "local").slice(0, 100);
}
