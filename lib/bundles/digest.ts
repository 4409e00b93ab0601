import { createHash } from "node:crypto";

/**
 * SHA-256 (FIPS 180-4) of the exact bytes, as lower-case hex: of the UTF-8 encoding when
 * given a string. A bundle's digest and the quoted value of its `ETag`.
 */
export function digestHex(bytes: string | Uint8Array): string {
  return createHash("sha256").update(typeof bytes === "string" ? Buffer.from(bytes, "utf8") : bytes).digest("hex");
}
