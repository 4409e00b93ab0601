import { NextResponse, type NextRequest } from "next/server";

// Redirects signed-out visitors away from console pages. A convenience only: every page,
// route handler and server action checks the role on the server itself.
export function proxy(request: NextRequest) {
  const hasSession =
    request.cookies.has("next-auth.session-token") || request.cookies.has("__Secure-next-auth.session-token");
  if (hasSession) return NextResponse.next();
  const url = request.nextUrl.clone();
  const next = request.nextUrl.pathname + request.nextUrl.search;
  url.pathname = "/sign-in";
  url.search = next && next !== "/" ? `?next=${encodeURIComponent(next)}` : "";
  return NextResponse.redirect(url);
}

export const config = {
  // Console pages only: never the API (the gateway API answers 401 itself), assets or the sign-in page.
  matcher: ["/((?!api/|_next/|sign-in|favicon.ico|robots.txt).*)"],
};
