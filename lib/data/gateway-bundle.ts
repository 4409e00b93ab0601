import "server-only";
import { QueryTypes } from "sequelize";
import { sequelize } from "@/models";

/**
 * Bundle bytes by digest. A bundle is immutable and addressed by its SHA-256, so a cached
 * entry can never be out of date: a new release has a new digest, and a revoked token
 * never gets this far. Least recently used entries go once the cache holds 64 MB.
 */
const LIMIT_BYTES = 64 * 1024 * 1024;
type Entry = { bytes: Buffer };
const cache = new Map<string, Entry>();
let held = 0;

function remember(digest: string, entry: Entry) {
  cache.set(digest, entry);
  held += entry.bytes.length;
  for (const [k, v] of cache) {
    if (held <= LIMIT_BYTES) break;
    cache.delete(k);
    held -= v.bytes.length;
  }
}

async function entryFor(bundleId: number, digest: string): Promise<Entry> {
  const hit = cache.get(digest);
  if (hit) {
    cache.delete(digest);
    cache.set(digest, hit);
    return hit;
  }
  const rows = await sequelize.query<{ bytes: Buffer }>("SELECT bytes FROM bundles WHERE id = ?", { replacements: [bundleId], type: QueryTypes.SELECT });
  if (rows.length !== 1) throw new Error(`bundle ${bundleId} vanished`);
  const entry = { bytes: Buffer.from(rows[0].bytes) };
  remember(digest, entry);
  return entry;
}

/** The exact bytes of a bundle (identity coding). */
export async function bundleBytes(bundleId: number, digest: string): Promise<Buffer> {
  return (await entryFor(bundleId, digest)).bytes;
}
