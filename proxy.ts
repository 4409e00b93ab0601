import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/lib/env";
import { createNonce, pageContentSecurityPolicy } from "@/lib/security/headers";

// Every page gets a Content-Security-Policy with a fresh nonce: set on the request so Next
// puts the nonce on its scripts while rendering, and on the response for the browser.
// Signed-out visitors are redirected away from console pages — a convenience only: every
// page, route handler and server action checks the role on the server itself.
// (The other security headers, and the API's own CSP, come from next.config.ts.)
export function proxy(request: NextRequest) {
  const csp = pageContentSecurityPolicy(createNonce(), { dev: env().NODE_ENV === "development" });
  const path = request.nextUrl.pathname;
  const hasSession =
    request.cookies.has("next-auth.session-token") || request.cookies.has("__Secure-next-auth.session-token");
  let response: NextResponse;
  if (hasSession || path === "/sign-in" || path.startsWith("/sign-in/")) {
    const headers = new Headers(request.headers);
    headers.set("Content-Security-Policy", csp);
    response = NextResponse.next({ request: { headers } });
  } else {
    const url = request.nextUrl.clone();
    const next = path + request.nextUrl.search;
    url.pathname = "/sign-in";
    url.search = next && next !== "/" ? `?next=${encodeURIComponent(next)}` : "";
    response = NextResponse.redirect(url);
  }
  response.headers.set("Content-Security-Policy", csp);
  return response;
}

export const config = {
  // Pages only: never the API (the gateway API answers 401 itself) or static assets.
  matcher: ["/((?!api/|_next/|favicon.ico|robots.txt).*)"],
};
