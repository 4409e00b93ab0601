import { digestHex } from "@/lib/bundles/digest";
import { verifyBytes } from "@/lib/bundles/signing";
import { UnreachableError } from "./backoff";
import { parseBundle } from "./bundle";
import { type PinnedKey, adoptKeys } from "./keys";
import { type Plan, buildPlan } from "./plan";
import { type BundleAnswer, type Registry, RefusedError, fetchSigningKeys, pullBundle } from "./registry";
import type { StateDir, StoredBundle } from "./state";
import { VerificationError, type VerifiedBundle, etagDigest, verifyBundle, verifyFreshness } from "./verify";

/** The bundle in force: its stored form and its runnable plan. */
export type InForce = { stored: StoredBundle; plan: Plan };

export type SyncContext = {
  reg: Registry;
  state: StateDir;
  /** The pinned keys; a sync may pin more. */
  keys: PinnedKey[];
  current: InForce | null;
  now: () => number;
  skewS: number;
  log: (line: string) => void;
};

/** What one pull came to. `fresh` is true when a valid freshness statement arrived with it. */
export type SyncOutcome =
  | { kind: "unchanged"; fresh: boolean; problem?: string }
  | { kind: "new"; next: InForce; fresh: true }
  | { kind: "refused"; message: string; release: number | null; digest: string | null; fresh: false }
  | { kind: "failed"; message: string; release: number; digest: string; fresh: true }
  | { kind: "unreachable"; message: string; retryAfterMs?: number; fresh: false }
  | { kind: "rejected"; status: number; message: string; fresh: false };

/**
 * Loads the last good bundle from the state dir and checks it again (digest, signature
 * under a pinned key, bundle rules) before it runs: state on disk is not trusted more
 * than the network. Null when there is none; throws when it does not check out.
 */
export function loadInForce(state: StateDir, keys: readonly PinnedKey[]): InForce | null {
  const stored = state.readBundle();
  if (stored === null) return null;
  const key = keys.find((k) => k.id === stored.keyId);
  if (digestHex(stored.text) !== stored.digest) throw new Error("the stored bundle does not match its digest");
  if (!key || !verifyBytes(key.publicKey, stored.text, stored.signature)) throw new Error(`the stored bundle's signature by "${stored.keyId}" does not verify`);
  const bundle = parseBundle(stored.text);
  return { stored, plan: buildPlan(bundle, stored.digest) };
}

/** Fetches the published keys and pins those a pinned key signed; returns whether any was added. */
async function refreshKeys(ctx: SyncContext): Promise<boolean> {
  let adoption;
  try {
    adoption = adoptKeys(ctx.keys, await fetchSigningKeys(ctx.reg));
  } catch (e) {
    ctx.log(`signing keys: could not fetch them: ${(e as Error).message}`);
    return false;
  }
  for (const r of adoption.refused) ctx.log(`signing keys: not pinning "${r.id}": ${r.reason}`);
  if (adoption.added.length === 0) return false;
  ctx.state.writeKeys(adoption.pinned);
  ctx.keys = adoption.pinned;
  ctx.log(`signing keys: pinned ${adoption.added.map((id) => `"${id}"`).join(", ")}`);
  return true;
}

/** Runs a check; on an unknown key id, adopts the registry's signed keys once and runs it again. */
async function withKeyRefresh<T>(ctx: SyncContext, check: () => T | Promise<T>): Promise<T> {
  try {
    return await check();
  } catch (e) {
    if (!(e instanceof VerificationError) || e.code !== "unknown-key" || !(await refreshKeys(ctx))) throw e;
    return check();
  }
}

/**
 * One pull (DESIGN.md "Gateway API", the agent): asks for the bundle (If-None-Match the
 * one in force), verifies a new one and its freshness statement, builds its runners and
 * stores it as the last good bundle (temp file + rename) — or says why not. The caller
 * switches to `next` and reports. A 304 or a re-pull of the same bytes only renews
 * freshness.
 */
export async function syncOnce(ctx: SyncContext): Promise<SyncOutcome> {
  let answer: BundleAnswer;
  try {
    answer = await pullBundle(ctx.reg, ctx.current?.stored.digest);
  } catch (e) {
    if (e instanceof UnreachableError) return { kind: "unreachable", message: e.message, retryAfterMs: e.retryAfterMs, fresh: false };
    if (e instanceof RefusedError) return { kind: "rejected", status: e.status, message: e.message, fresh: false };
    return { kind: "unreachable", message: (e as Error).message, fresh: false };
  }
  const cur = ctx.current?.stored;
  if (answer.status === 304) {
    if (!cur || etagDigest(answer.etag) !== cur.digest) {
      return { kind: "refused", message: `a 304 answer names ETag ${String(answer.etag)}, not the bundle in force`, release: null, digest: null, fresh: false };
    }
    return checkFresh(ctx, answer.freshness, cur);
  }
  let verified: VerifiedBundle;
  try {
    verified = await withKeyRefresh(ctx, () => verifyBundle(answer, ctx.keys, cur ? { gateway: cur.gateway, release: cur.release } : {}));
    await withKeyRefresh(ctx, () => verifyFreshness(answer.freshness, ctx.keys, { ...verified.bundle, digest: verified.digest }, ctx.now(), ctx.skewS));
  } catch (e) {
    if (!(e instanceof VerificationError)) throw e;
    const release = /^\d{1,9}$/.test(answer.release?.trim() ?? "") ? Number(answer.release) : null;
    return { kind: "refused", message: `refused the bundle: ${e.message}`, release, digest: digestHex(answer.body), fresh: false };
  }
  if (cur && verified.digest === cur.digest) return { kind: "unchanged", fresh: true };
  const { bundle, digest } = verified;
  let plan: Plan;
  const stored: StoredBundle = {
    release: bundle.release,
    gateway: bundle.gateway,
    digest,
    keyId: verified.keyId,
    signature: verified.signature,
    text: verified.text,
    appliedAt: new Date(ctx.now()).toISOString(),
  };
  try {
    plan = buildPlan(bundle, digest);
    ctx.state.writeBundle(stored);
  } catch (e) {
    return { kind: "failed", message: `release ${bundle.release} cannot run here: ${(e as Error).message}`, release: bundle.release, digest, fresh: true };
  }
  return { kind: "new", next: { stored, plan }, fresh: true };
}

async function checkFresh(ctx: SyncContext, jws: string | null, cur: StoredBundle): Promise<SyncOutcome> {
  try {
    await withKeyRefresh(ctx, () => verifyFreshness(jws, ctx.keys, cur, ctx.now(), ctx.skewS));
    return { kind: "unchanged", fresh: true };
  } catch (e) {
    if (!(e instanceof VerificationError)) throw e;
    return { kind: "unchanged", fresh: false, problem: e.message };
  }
}
