// Cross-site request protection for state-changing API routes that authenticate with the
// session cookie. SameSite=Lax already keeps the cookie off cross-site POSTs from other
// sites, but not from sibling subdomains (same site, other origin) or older browsers, so
// the request's own provenance headers decide, in the spirit of the Fetch Metadata
// guidance (W3C Fetch Metadata Request Headers; OWASP CSRF Prevention Cheat Sheet).

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/** Routes that do not use the session cookie: next-auth checks its own CSRF token, gateways send bearer tokens. */
const EXEMPT_PREFIXES = ["/api/auth/", "/api/gateway/"];

export type CrossSiteVerdict = { ok: true } | { ok: false; reason: string };

/**
 * Whether a request may change state. The app's own origin is NEXTAUTH_URL's, or the host
 * the request was sent to (X-Forwarded-Host, else Host — what Next itself compares server
 * actions against), so a console reached under another name of the same server works.
 *
 * 1. GET, HEAD, OPTIONS and the exempt prefixes pass.
 * 2. An Origin header decides when present: it must be the app's own ("null" never is).
 * 3. Else Sec-Fetch-Site: only "same-origin" and "none" (typed by the user) pass.
 * 4. Else a Referer must be the app's own.
 * 5. None of the three: a non-browser client (curl, a script) — every current browser sends
 *    Origin on a cross-origin POST, and a script holding a session cookie was given it by
 *    its owner. It passes, as Next lets such server-action requests pass.
 */
export function checkCrossSite(req: Request, appUrl?: string): CrossSiteVerdict {
  if (SAFE_METHODS.has(req.method.toUpperCase())) return { ok: true };
  const url = new URL(req.url);
  if (EXEMPT_PREFIXES.some((p) => url.pathname.startsWith(p))) return { ok: true };
  const h = req.headers;
  const forwarded = h.get("x-forwarded-host")?.split(",")[0].trim();
  const host = (forwarded || h.get("host") || url.host).toLowerCase();
  const configured = appUrl ? safeOrigin(appUrl) : null;
  const own = (origin: string | null) => origin !== null && (origin === configured || new URL(origin).host === host);

  const origin = h.get("origin");
  if (origin !== null) {
    return own(safeOrigin(origin)) ? { ok: true } : { ok: false, reason: `requests from ${origin.slice(0, 100)} may not change data here` };
  }
  const site = h.get("sec-fetch-site");
  if (site !== null) {
    return site === "same-origin" || site === "none" ? { ok: true } : { ok: false, reason: `a ${site.slice(0, 20)} request may not change data here` };
  }
  const referer = h.get("referer");
  if (referer !== null) {
    return own(safeOrigin(referer)) ? { ok: true } : { ok: false, reason: "requests from another site may not change data here" };
  }
  return { ok: true };
}

/** The serialised origin of a URL, or null for "null", opaque origins and garbage. */
function safeOrigin(value: string): string | null {
  try {
    const u = new URL(value);
    return u.protocol === "http:" || u.protocol === "https:" ? u.origin : null;
  } catch {
    return null;
  }
}
