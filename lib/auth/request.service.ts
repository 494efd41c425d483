import "server-only";
import { cookies, headers } from "next/headers";
import { getDb } from "@/lib/core/db";
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";
import type { SiteRole } from "@/lib/core/vocabulary";
import { SITE_ROLES } from "@/lib/core/vocabulary";
import { readersOf } from "@/lib/auth/read-matrix";
import type { Actor } from "@/lib/core/actor";
import type { SessionUser } from "@/lib/auth/session.service";
import { resolveSession } from "@/lib/auth/session.service";

export type SignedIn = SessionUser & Actor;

/** Secure cookies everywhere except plain-HTTP loopback (the demo on 127.0.0.1 / localhost). */
export async function cookieIsSecure(): Promise<boolean> {
  const h = await headers();
  const host = (h.get("x-forwarded-host") ?? h.get("host") ?? "").replace(/:\d+$/, "");
  const proto = h.get("x-forwarded-proto") ?? (["127.0.0.1", "localhost", "[::1]"].includes(host) ? "http" : "https");
  return proto === "https";
}

export async function sessionCookieName(): Promise<string> {
  return (await cookieIsSecure()) ? "__Host-tv_session" : "tv_session";
}

export async function getSessionToken(): Promise<string | null> {
  const jar = await cookies();
  return jar.get("__Host-tv_session")?.value ?? jar.get("tv_session")?.value ?? null;
}

/** The signed-in user for this request, checked against the session table (never trusted from the client). */
export async function getSignedIn(): Promise<SignedIn | null> {
  const token = await getSessionToken();
  if (!token) return null;
  const now = new Date();
  const user = await resolveSession(await getDb(), token, now);
  return user ? { ...user, now } : null;
}

/** Server-side authorisation for every action and route handler: signed in, and in one of the roles. */
export async function requireRole(roles: readonly SiteRole[]): Promise<Result<SignedIn>> {
  const user = await getSignedIn();
  if (!user) return fail("AUTH.UNAUTHENTICATED", "Sign in first");
  if (!roles.includes(user.role))
    return fail("AUTH.FORBIDDEN", `This needs one of these roles: ${roles.map((r) => r.toLowerCase()).join(", ")}`);
  if (user.mustChangePassword)
    return fail(
      "AUTH.PASSWORD_CHANGE_REQUIRED",
      "Choose your own password first (Your settings): the one you were given is for the first sign-in only",
    );
  return ok(user);
}

/** Server-side read check for GET routes, exports and reports: the read matrix decides by path. */
export async function requireReader(request: Request): Promise<Result<SignedIn>> {
  const roles = readersOf(new URL(request.url).pathname);
  if (roles === "public") return requireRole(SITE_ROLES);
  if (roles.length === 0) {
    const user = await getSignedIn();
    return user
      ? fail("AUTH.FORBIDDEN", "No role may read this address")
      : fail("AUTH.UNAUTHENTICATED", "Sign in first");
  }
  return requireRole(roles);
}
