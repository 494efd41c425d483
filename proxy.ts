// Optimistic redirect to the sign-in page when there is no session cookie at all. This is not the
// security check: every page, action and route handler checks the session on the server itself.
import { NextResponse } from "next/server";
import type { NextRequest } from "next/server";

export function proxy(request: NextRequest): NextResponse {
  const has = request.cookies.has("tv_session") || request.cookies.has("__Host-tv_session");
  if (has) return NextResponse.next();
  const url = request.nextUrl.clone();
  url.search = `?next=${encodeURIComponent(request.nextUrl.pathname + request.nextUrl.search)}`;
  url.pathname = "/login";
  return NextResponse.redirect(url);
}

export const config = {
  matcher: ["/((?!login|api/|_next/|icon.svg|favicon.ico).*)"],
};
