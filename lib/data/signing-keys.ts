import "server-only";
import { loadSigningKeys, type SigningKey } from "@/lib/bundles/signing";
import { env } from "@/lib/env";

let loaded: { active: SigningKey; keys: SigningKey[] } | null = null;

/**
 * The registry's signing keys: from configuration (SLUICE_SIGNING_KEYS holding the keys'
 * JSON, or SLUICE_SIGNING_KEYS_FILE naming a mounted file) — several app instances must
 * be given the same keys — or, on one machine, generated under the data directory on
 * first use. Read once per process; the keys themselves live outside it.
 */
export function signingKeys(): { active: SigningKey; keys: SigningKey[] } {
  if (loaded) return loaded;
  const e = env();
  loaded = loadSigningKeys({ envJson: e.SLUICE_SIGNING_KEYS, filePath: e.SLUICE_SIGNING_KEYS_FILE, dataDir: e.SLUICE_DATA_DIR });
  return loaded;
}
