// Security headers for every response. Pure and dependency-free: next.config.ts and
// proxy.ts both import it. Cache-Control is deliberately absent — each route sets its own
// (the gateway API's `private, no-cache` must reach gateways untouched).

/**
 * The console pages' Content-Security-Policy, with a per-request nonce. Next.js reads the
 * nonce from this header on the request and puts it on its own scripts (see proxy.ts and
 * the Next.js guide "How to set a Content Security Policy"); 'strict-dynamic' passes the
 * trust on to the chunks those scripts load. 'self' stays only as a fallback for browsers
 * without CSP 3.
 *
 * style-src keeps 'unsafe-inline' on purpose: React renders `style` attributes (chart
 * sizes, bar widths) and sonner injects its stylesheet at run time; neither can carry a
 * nonce, and with a nonce in style-src the browser would ignore 'unsafe-inline'.
 * worker-src: the workbench's preview worker is a same-origin module script; blob: covers
 * a bundler that bootstraps workers from a blob URL.
 */
export function pageContentSecurityPolicy(nonce: string, opts: { dev?: boolean } = {}): string {
  return [
    "default-src 'self'",
    // React in development evaluates server error stacks; production needs no eval.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${opts.dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

/** API answers are data, never documents: nothing may load from them or frame them. */
export const API_CONTENT_SECURITY_POLICY = "default-src 'none'; frame-ancestors 'none'";

/** A fresh nonce: 128 bits from the platform CSPRNG, base64. */
export function createNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}

/** Features the console never uses, switched off for it and anything it might embed. */
const DENIED_FEATURES = [
  "accelerometer",
  "autoplay",
  "camera",
  "display-capture",
  "geolocation",
  "gyroscope",
  "hid",
  "magnetometer",
  "microphone",
  "midi",
  "payment",
  "publickey-credentials-get",
  "screen-wake-lock",
  "serial",
  "usb",
  "xr-spatial-tracking",
];

/** Headers every response carries (pages, API, static assets). */
export const SECURITY_HEADERS: readonly { key: string; value: string }[] = [
  { key: "X-Frame-Options", value: "DENY" },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "Permissions-Policy", value: DENIED_FEATURES.map((f) => `${f}=()`).join(", ") },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
];
