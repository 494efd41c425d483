// Runs on every request: security headers with a fresh CSP nonce, and an optimistic redirect to
// the sign-in page when a page is asked for without any session cookie. The redirect is not the
// security check: every page, action and route handler checks the session on the server itself.
import { NextResponse } from "next/server";
import type { NextRequest } from "next/server";

function contentSecurityPolicy(nonce: string, dev: boolean): string {
  return [
    "default-src 'self'",
    // Next adds the nonce to its own scripts when it finds this policy on the request.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    // Inline style attributes (bar widths, the grid's layout) cannot carry a nonce.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'none'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

const PUBLIC_PAGES = ["/login"];

/** Next reads at most 1 MB of a server action's body; a larger one is refused here with its limit named. */
const ACTION_BODY_LIMIT = 1_000_000;

function tooLargeAction(request: NextRequest): NextResponse | null {
  if (request.method !== "POST" || !request.headers.has("next-action")) return null;
  const length = Number(request.headers.get("content-length") ?? "");
  if (!(length > ACTION_BODY_LIMIT)) return null;
  return new NextResponse("The request is larger than 1 MB", {
    status: 413,
    headers: { "content-type": "text/plain; charset=utf-8" },
  });
}

export function proxy(request: NextRequest): NextResponse {
  const nonce = Buffer.from(crypto.randomUUID()).toString("base64");
  const csp = contentSecurityPolicy(nonce, process.env.NODE_ENV !== "production");
  const path = request.nextUrl.pathname;
  const hasSession = request.cookies.has("tv_session") || request.cookies.has("__Host-tv_session");
  let response: NextResponse;
  const refused = tooLargeAction(request);
  if (refused) {
    response = refused;
  } else if (!hasSession && !path.startsWith("/api/") && !PUBLIC_PAGES.includes(path)) {
    const url = request.nextUrl.clone();
    url.search = `?next=${encodeURIComponent(path + request.nextUrl.search)}`;
    url.pathname = "/login";
    response = NextResponse.redirect(url);
  } else {
    const headers = new Headers(request.headers);
    headers.set("x-nonce", nonce);
    // Pages check the read matrix against the path asked for (app/_ui/site.ts).
    headers.set("x-pathname", path);
    headers.set("Content-Security-Policy", csp);
    response = NextResponse.next({ request: { headers } });
  }
  response.headers.set("Content-Security-Policy", csp);
  response.headers.set("X-Content-Type-Options", "nosniff");
  response.headers.set("Referrer-Policy", "same-origin");
  response.headers.set("X-Frame-Options", "DENY");
  // Only the collect page may ask where the phone is (it keeps a distance band, never the position).
  const geolocation = path === "/collect" || path.startsWith("/collect/") ? "(self)" : "()";
  response.headers.set("Permissions-Policy", `camera=(self), microphone=(), geolocation=${geolocation}`);
  if (request.nextUrl.protocol === "https:")
    response.headers.set("Strict-Transport-Security", "max-age=31536000; includeSubDomains");
  return response;
}

export const config = {
  matcher: ["/((?!_next/static|_next/image|icon.svg|favicon.ico).*)"],
};
