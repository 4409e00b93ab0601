import type { PublicKeyEntry } from "@/lib/bundles/signing";
import { type RetryDeps, withRetries } from "./backoff";
import type { Report } from "./state";

/** How the agent reaches the registry. `token` is read again for every request (a rotated token file is picked up). */
export type Registry = { url: string; token: () => string; retry: RetryDeps; fetch?: typeof fetch; timeoutMs?: number };

/** The registry answered with a status retrying will not change (401, 403, 404, 413, another 4xx). */
export class RefusedError extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
    this.name = "RefusedError";
  }
}

export type BundleAnswer =
  | { status: 200; body: Uint8Array; etag: string | null; signature: string | null; release: string | null; freshness: string | null }
  | { status: 304; etag: string | null; freshness: string | null };

/** A bundle larger than this is refused before it is read whole. */
export const MAX_BUNDLE_BYTES = 64 * 1024 * 1024;

function endpoint(reg: Registry, name: string): string {
  const base = reg.url.endsWith("/") ? reg.url : `${reg.url}/`;
  return new URL(`api/gateway/v1/${name}`, base).toString();
}

async function request(reg: Registry, name: string, init: RequestInit): Promise<Response> {
  const doFetch = reg.fetch ?? fetch;
  const url = endpoint(reg, name);
  return withRetries(() => {
    const headers = new Headers(init.headers);
    headers.set("authorization", `Bearer ${reg.token()}`);
    return doFetch(url, { ...init, headers, redirect: "error", signal: AbortSignal.timeout(reg.timeoutMs ?? 30_000) });
  }, reg.retry);
}

/** RFC 6750 §3: the `error` parameter of `WWW-Authenticate: Bearer …`. */
function bearerError(res: Response): string | undefined {
  return /error="([^"]*)"/.exec(res.headers.get("www-authenticate") ?? "")?.[1];
}

async function refusal(res: Response, what: string): Promise<RefusedError> {
  let detail = "";
  try {
    const body = (await res.json()) as { error?: unknown };
    if (typeof body?.error === "string") detail = `: ${body.error}`;
  } catch {
    // not JSON; the status says enough
  }
  const messages: Record<number, string> = {
    401: `the registry does not accept the token (401${bearerError(res) ? ` ${bearerError(res)}` : ""}); check --token-file`,
    403: "the registry forbids this token (403)",
    404: what === "bundle" ? `the registry has no release for this gateway yet (404)${detail}` : `the registry has no ${what} endpoint (404)${detail}`,
    413: `the registry refused the ${what} request as too large (413)`,
  };
  return new RefusedError(res.status, messages[res.status] ?? `the registry answered ${what} with HTTP ${res.status}${detail}`);
}

/**
 * `GET /api/gateway/v1/bundle` (DESIGN.md "Gateway API"), asking for gzip and sending the
 * bundle in force's identity and gzip ETags in `If-None-Match` (RFC 9110 §13.1.2) so either
 * form of the server's tag matches. fetch undoes the content coding, so the body is the
 * exact uncompressed bytes the signature covers. Throws a {@link RefusedError} or the
 * retries' UnreachableError.
 */
export async function pullBundle(reg: Registry, digest?: string): Promise<BundleAnswer> {
  const headers: Record<string, string> = { accept: "application/yaml", "accept-encoding": "gzip" };
  if (digest) headers["if-none-match"] = `"${digest}", "${digest}-gzip"`;
  const res = await request(reg, "bundle", { method: "GET", headers });
  const h = res.headers;
  if (res.status === 304) return { status: 304, etag: h.get("etag"), freshness: h.get("bundle-freshness") };
  if (res.status !== 200) throw await refusal(res, "bundle");
  const length = Number(h.get("content-length") ?? "0");
  if (length > MAX_BUNDLE_BYTES) {
    await res.body?.cancel();
    throw new RefusedError(200, `the bundle is ${length} bytes, more than the agent takes (${MAX_BUNDLE_BYTES})`);
  }
  const body = new Uint8Array(await res.arrayBuffer());
  if (body.length > MAX_BUNDLE_BYTES) throw new RefusedError(200, `the bundle is more than ${MAX_BUNDLE_BYTES} bytes`);
  return { status: 200, body, etag: h.get("etag"), signature: h.get("bundle-signature"), release: h.get("bundle-release"), freshness: h.get("bundle-freshness") };
}

/** `GET /api/gateway/v1/signing-key`: the keys the registry publishes (the caller decides which to trust). */
export async function fetchSigningKeys(reg: Registry): Promise<PublicKeyEntry[]> {
  const res = await request(reg, "signing-key", { method: "GET", headers: { accept: "application/json" } });
  if (res.status !== 200) throw await refusal(res, "signing-key");
  const body = (await res.json()) as { keys?: unknown };
  if (!Array.isArray(body?.keys)) throw new RefusedError(200, "the signing-key answer lists no keys");
  return body.keys as PublicKeyEntry[];
}

/** `PUT /api/gateway/v1/check-in`; resolves on 204 (or any 2xx). */
export async function sendReport(reg: Registry, report: Report): Promise<void> {
  const res = await request(reg, "check-in", { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify(report) });
  if (res.status >= 200 && res.status < 300) {
    await res.body?.cancel();
    return;
  }
  throw await refusal(res, "check-in");
}
