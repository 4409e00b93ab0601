import { createHash, randomBytes } from "node:crypto";

/**
 * Gateway tokens (DESIGN.md "Gateway API"): `sgw_` and 32 bytes (256 bits) from the
 * operating system's CSPRNG in base64url. Only the SHA-256 of the whole token is stored;
 * the first 12 characters (`sgw_` and 8 more, 48 bits) are kept as a prefix so people can
 * tell tokens apart in lists without the registry being able to reproduce one.
 */
export const TOKEN_PREFIX = "sgw_";
export const TOKEN_PATTERN = /^sgw_[A-Za-z0-9_-]{43}$/;
export const SHOWN_PREFIX_LENGTH = 12;

export type NewToken = { token: string; hash: string; prefix: string };

export function generateToken(): NewToken {
  const token = TOKEN_PREFIX + randomBytes(32).toString("base64url");
  return { token, hash: hashToken(token), prefix: token.slice(0, SHOWN_PREFIX_LENGTH) };
}

/** SHA-256 hex of the token's UTF-8 bytes: the only form the database holds. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

/**
 * The bearer token of an `Authorization` header (RFC 6750 §2.1; the scheme is
 * case-insensitive, RFC 9110 §11.1), or null when there is none. A header with another
 * scheme or a malformed credential yields "" (present but unusable: invalid_token).
 */
export function bearerToken(header: string | null): string | null {
  if (header === null || header.trim() === "") return null;
  const m = /^\s*Bearer\s+([A-Za-z0-9\-._~+/]+=*)\s*$/i.exec(header);
  return m ? m[1] : "";
}
