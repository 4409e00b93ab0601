import { createPublicKey } from "node:crypto";
import { compactVerify } from "jose";
import { digestHex } from "@/lib/bundles/digest";
import { verifyBytes } from "@/lib/bundles/signing";
import { type AgentBundle, parseBundle } from "./bundle";
import type { PinnedKey } from "./keys";

export type VerifyCode = "digest" | "signature" | "unknown-key" | "bundle" | "gateway" | "release" | "freshness";

/** A pulled bundle or freshness statement the agent refuses; `keyId` is set for "unknown-key". */
export class VerificationError extends Error {
  constructor(
    readonly code: VerifyCode,
    message: string,
    readonly keyId?: string,
  ) {
    super(message);
    this.name = "VerificationError";
  }
}

/** `Bundle-Signature: key=<id>, ed25519=<base64>` (DESIGN.md "Gateway API"), parameters in any order. */
export function parseSignatureHeader(value: string | null): { keyId: string; signature: string } {
  const params = new Map<string, string>();
  for (const part of (value ?? "").split(",")) {
    const at = part.indexOf("=");
    if (at > 0) params.set(part.slice(0, at).trim().toLowerCase(), part.slice(at + 1).trim().replace(/^"(.*)"$/, "$1"));
  }
  const keyId = params.get("key");
  const signature = params.get("ed25519");
  if (!keyId || !signature) throw new VerificationError("signature", `no usable Bundle-Signature header (got ${value === null ? "none" : JSON.stringify(value)})`);
  return { keyId, signature };
}

/**
 * The SHA-256 hex an ETag names: `"<hex>"`, or `"<hex>-gzip"` for a compressed response
 * (RFC 9110 §8.8.3: a content coding needs its own tag). Undefined for any other tag.
 */
export function etagDigest(etag: string | null): string | undefined {
  const m = /^(?:W\/)?"([0-9a-f]{64})(?:-gzip)?"$/.exec(etag?.trim() ?? "");
  return m?.[1];
}

/** What the pulled bundle must agree with: the state of the last good bundle, when there is one. */
export type Expected = { gateway?: string; release?: number };
export type Pulled = { body: Uint8Array; etag: string | null; signature: string | null; release: string | null };
export type VerifiedBundle = { bundle: AgentBundle; text: string; digest: string; keyId: string; signature: string };

/**
 * Checks a pulled bundle before anything reads it (DESIGN.md "Gateway API", the agent):
 * the SHA-256 (FIPS 180-4) of the exact bytes equals the ETag's; the Ed25519 signature
 * (RFC 8032) over the same bytes verifies under a pinned key (an unknown key id is its
 * own code, so the caller can fetch and adopt a signed successor and try again); then
 * the document is a valid bundle signed with the key it names, for the gateway the agent
 * ran last and of a release not lower than the one it runs (equal is a re-pull), matching
 * `Bundle-Release`. Throws a {@link VerificationError}.
 */
export function verifyBundle(pulled: Pulled, keys: readonly PinnedKey[], expected: Expected): VerifiedBundle {
  const digest = digestHex(pulled.body);
  const tagged = etagDigest(pulled.etag);
  if (tagged === undefined) throw new VerificationError("digest", `the ETag ${JSON.stringify(pulled.etag)} names no SHA-256 digest`);
  if (tagged !== digest) throw new VerificationError("digest", `the body's SHA-256 ${digest.slice(0, 12)}… differs from the ETag's ${tagged.slice(0, 12)}…`);
  const { keyId, signature } = parseSignatureHeader(pulled.signature);
  const key = keys.find((k) => k.id === keyId);
  if (!key) throw new VerificationError("unknown-key", `the bundle is signed with key "${keyId}", which is not pinned`, keyId);
  if (!verifyBytes(key.publicKey, pulled.body, signature)) throw new VerificationError("signature", `the Ed25519 signature by key "${keyId}" does not verify`);
  let text: string;
  let bundle: AgentBundle;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(pulled.body);
    bundle = parseBundle(text);
  } catch (e) {
    throw new VerificationError("bundle", (e as Error).message);
  }
  if (bundle.key !== keyId) throw new VerificationError("bundle", `the bundle names key "${bundle.key}" but is signed with "${keyId}"`);
  if (expected.gateway !== undefined && bundle.gateway !== expected.gateway) {
    throw new VerificationError("gateway", `the bundle is for gateway ${bundle.gateway}; this agent runs ${expected.gateway}`);
  }
  if (expected.release !== undefined && bundle.release < expected.release) {
    throw new VerificationError("release", `release ${bundle.release} is lower than release ${expected.release}, which this agent runs`);
  }
  if (pulled.release !== null && pulled.release.trim() !== String(bundle.release)) {
    throw new VerificationError("release", `Bundle-Release says ${pulled.release}, the bundle ${bundle.release}`);
  }
  return { bundle, text, digest, keyId, signature };
}

/** The payload of a `Bundle-Freshness` statement (iat and exp in seconds since the epoch). */
export type Freshness = { gateway: string; release: number; digest: string; iat: number; exp: number; kid: string };

/**
 * Checks a `Bundle-Freshness` statement: a JWS compact serialisation (RFC 7515) with alg
 * EdDSA (RFC 8037), verified with jose's compactVerify under the pinned key its `kid`
 * names; its payload must name the gateway, release and digest of `bundle` (the bundle
 * in force, or the one just pulled), not be issued more than `skewS` seconds ahead of
 * `nowMs`, and not have expired more than `skewS` seconds ago. Throws a
 * {@link VerificationError} (code "unknown-key" for a kid that is not pinned).
 */
export async function verifyFreshness(
  jws: string | null,
  keys: readonly PinnedKey[],
  bundle: { gateway: string; release: number; digest: string },
  nowMs: number,
  skewS: number,
): Promise<Freshness> {
  if (!jws) throw new VerificationError("freshness", "the answer carries no Bundle-Freshness statement");
  let kid = "";
  let payload: Uint8Array;
  try {
    const result = await compactVerify(
      jws.trim(),
      (header) => {
        kid = typeof header.kid === "string" ? header.kid : "";
        const key = keys.find((k) => k.id === kid);
        if (!key) throw new VerificationError("unknown-key", `the freshness statement is signed with key "${kid}", which is not pinned`, kid);
        return createPublicKey(key.publicKey);
      },
      { algorithms: ["EdDSA"] },
    );
    payload = result.payload;
  } catch (e) {
    if (e instanceof VerificationError) throw e;
    throw new VerificationError("freshness", `the freshness statement does not verify: ${(e as Error).message}`);
  }
  let claims: Record<string, unknown>;
  try {
    claims = JSON.parse(new TextDecoder().decode(payload)) as Record<string, unknown>;
  } catch {
    throw new VerificationError("freshness", "the freshness statement's payload is not JSON");
  }
  const { gateway, release, digest, iat, exp } = claims;
  if (typeof iat !== "number" || typeof exp !== "number") throw new VerificationError("freshness", "the freshness statement lacks iat or exp");
  if (gateway !== bundle.gateway || release !== bundle.release || digest !== bundle.digest) {
    throw new VerificationError(
      "freshness",
      `the freshness statement is for ${String(gateway)} release ${String(release)} (${String(digest).slice(0, 12)}…), not ${bundle.gateway} release ${bundle.release} (${bundle.digest.slice(0, 12)}…)`,
    );
  }
  const now = nowMs / 1000;
  if (exp + skewS < now) throw new VerificationError("freshness", `the freshness statement expired ${Math.round(now - exp)} s ago`);
  if (iat - skewS > now) throw new VerificationError("freshness", `the freshness statement is issued ${Math.round(iat - now)} s in the future`);
  return { gateway, release, digest, iat, exp, kid };
}
