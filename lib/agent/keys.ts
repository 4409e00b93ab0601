import { createPublicKey } from "node:crypto";
import { KEY_ID_PATTERN, type PublicKeyEntry, verifyBytes } from "@/lib/bundles/signing";

/** A registry public key the agent trusts (Ed25519, SPKI PEM). */
export type PinnedKey = { id: string; publicKey: string };

/**
 * A key list as `GET /api/gateway/v1/signing-key` answers it (`{ keys: [...] }`) or a plain
 * array of `{ id, publicKey }`: the form of the trust file and of the state dir's pins.
 * Throws when a key is not an Ed25519 public key in PEM or an id repeats.
 */
export function readKeyList(text: string, source: string): PinnedKey[] {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new Error(`${source} is not JSON`);
  }
  const list = Array.isArray(raw) ? raw : (raw as { keys?: unknown } | null)?.keys;
  if (!Array.isArray(list) || list.length === 0) throw new Error(`${source} lists no keys`);
  const keys = list.map((k, i) => checkPublicKey(k, `${source}: key ${i + 1}`));
  const ids = new Set<string>();
  for (const k of keys) {
    if (ids.has(k.id)) throw new Error(`${source}: key id "${k.id}" appears twice`);
    ids.add(k.id);
  }
  return keys;
}

/** The JSON the agent keeps its pins in. */
export function keyListText(keys: readonly PinnedKey[]): string {
  return `${JSON.stringify({ keys: keys.map(({ id, publicKey }) => ({ id, publicKey })) }, null, 2)}\n`;
}

function checkPublicKey(k: unknown, where: string): PinnedKey {
  const x = (k ?? {}) as Record<string, unknown>;
  if (typeof x.id !== "string" || !KEY_ID_PATTERN.test(x.id)) throw new Error(`${where} needs an id of letters, digits, ".", "_" or "-"`);
  if (typeof x.publicKey !== "string") throw new Error(`${where} ("${x.id}") needs publicKey (SPKI PEM)`);
  let type: string | undefined;
  try {
    type = createPublicKey(x.publicKey).asymmetricKeyType;
  } catch {
    throw new Error(`${where} ("${x.id}") is not a readable public key in PEM`);
  }
  if (type !== "ed25519") throw new Error(`${where} ("${x.id}") is not an Ed25519 key`);
  return { id: x.id, publicKey: x.publicKey };
}

export type Adoption = { pinned: PinnedKey[]; added: string[]; refused: { id: string; reason: string }[] };

/**
 * Extends the pins with published keys (lib/bundles/README.md, "Signing keys and
 * rotation"): a key is pinned only when its `signedBy` is a valid Ed25519 signature
 * (RFC 8032) over the exact bytes of its `publicKey` by a key already pinned — a chain
 * k1 → k2 → k3 is followed in any order. A pinned id is never given another key, and a
 * key no pinned key signed is refused.
 */
export function adoptKeys(pinned: readonly PinnedKey[], published: readonly PublicKeyEntry[]): Adoption {
  const out = [...pinned];
  const added: string[] = [];
  const byId = () => new Map(out.map((k) => [k.id, k]));
  let waiting = published.filter((p) => !pinned.some((k) => k.id === p.id));
  const refused: Adoption["refused"] = published
    .filter((p) => pinned.some((k) => k.id === p.id && k.publicKey !== p.publicKey))
    .map((p) => ({ id: p.id, reason: "a pinned key has this id with other key material" }));
  for (let grew = true; grew; ) {
    grew = false;
    const trusted = byId();
    for (const p of waiting) {
      const signer = p.signedBy && trusted.get(p.signedBy.keyId);
      if (!signer || !p.signedBy) continue;
      let ok = false;
      try {
        ok = checkPublicKey(p, p.id) !== undefined && verifyBytes(signer.publicKey, p.publicKey, p.signedBy.signature);
      } catch {
        ok = false;
      }
      if (!ok) continue;
      out.push({ id: p.id, publicKey: p.publicKey });
      added.push(p.id);
      grew = true;
    }
    waiting = waiting.filter((p) => !added.includes(p.id));
  }
  for (const p of waiting) {
    const signer = p.signedBy?.keyId;
    const reason = !signer ? "not signed by a pinned key" : out.some((k) => k.id === signer) ? `its signature by "${signer}" does not verify` : `signed by "${signer}", which is not pinned`;
    refused.push({ id: p.id, reason });
  }
  return { pinned: out, added, refused };
}
