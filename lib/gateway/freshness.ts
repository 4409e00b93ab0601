import { createPrivateKey, type KeyObject } from "node:crypto";
import { CompactSign } from "jose";

/**
 * The freshness statement every 200 and 304 carries (DESIGN.md "Gateway API"): a JWS
 * compact serialisation (RFC 7515 §7.1), alg EdDSA with an Ed25519 key (RFC 8037 §3.1),
 * `kid` naming the registry key, payload `{gateway, release, digest, iat, exp}` with
 * times in seconds since the epoch. A gateway that keeps receiving valid statements knows
 * "nothing changed" is current, not an old answer replayed.
 */
export type FreshnessClaims = { gateway: string; release: number; digest: string; iat: number; exp: number };

const keys = new Map<string, KeyObject>();
function keyObject(pem: string): KeyObject {
  let k = keys.get(pem);
  if (!k) {
    k = createPrivateKey(pem);
    if (keys.size > 8) keys.clear();
    keys.set(pem, k);
  }
  return k;
}

const encoder = new TextEncoder();

export async function signFreshness(claims: FreshnessClaims, key: { id: string; privateKeyPem: string }): Promise<string> {
  const payload = encoder.encode(JSON.stringify({ gateway: claims.gateway, release: claims.release, digest: claims.digest, iat: claims.iat, exp: claims.exp }));
  return new CompactSign(payload).setProtectedHeader({ alg: "EdDSA", kid: key.id }).sign(keyObject(key.privateKeyPem));
}

/**
 * How long a statement stays valid: three poll intervals (the point at which the registry
 * itself calls the gateway stale), at least five minutes.
 */
export function freshnessLifetime(pollSeconds: number): number {
  return Math.max(300, 3 * pollSeconds);
}

/**
 * Statements are signed once per gateway, bundle and second (iat has one-second
 * resolution), so a burst of polls costs one signature.
 */
const recent = new Map<string, { second: number; jws: Promise<string> }>();

export function freshnessFor(gateway: string, release: number, digest: string, pollSeconds: number, key: { id: string; privateKeyPem: string }, nowMs = Date.now()): Promise<string> {
  const second = Math.floor(nowMs / 1000);
  const cacheKey = `${gateway}|${release}|${digest}|${key.id}|${pollSeconds}`;
  const hit = recent.get(cacheKey);
  if (hit && hit.second === second) return hit.jws;
  const jws = signFreshness({ gateway, release, digest, iat: second, exp: second + freshnessLifetime(pollSeconds) }, key);
  if (recent.size > 10_000) recent.clear();
  recent.set(cacheKey, { second, jws });
  jws.catch(() => recent.delete(cacheKey));
  return jws;
}
