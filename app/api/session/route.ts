import { cookies, headers } from "next/headers";
import type { NextResponse } from "next/server";
import { getDb } from "@/lib/core/db";
import { parseBody, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { SignInSchema } from "@/lib/auth/session.schema";
import { signIn, signOut } from "@/lib/auth/session.service";
import { cookieIsSecure, getSessionToken, sessionCookieName } from "@/lib/auth/request.service";
import { handled } from "@/lib/api/handle.service";

/** JSON sign-in for API clients and scripts: sets the same HttpOnly session cookie as the sign-in page. */
export const POST = handled("POST /api/session", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const body = await parseBody(request, SignInSchema);
  if (!body.ok) return respond(body);
  const ip = ((await headers()).get("x-forwarded-for") ?? "").split(",")[0]?.trim() || "local";
  const result = await signIn(await getDb(), body.value, { ip, now: new Date() });
  if (!result.ok) return respond(result);
  (await cookies()).set(await sessionCookieName(), result.value.token, {
    httpOnly: true,
    secure: await cookieIsSecure(),
    sameSite: "lax",
    path: "/",
    expires: result.value.expiresAt,
  });
  return respond({ ok: true, value: { user: result.value.user, expiresAt: result.value.expiresAt } });
});

export const DELETE = handled("DELETE /api/session", async (request: Request): Promise<NextResponse> => {
  const origin = requireSameOrigin(request);
  if (!origin.ok) return respond(origin);
  const token = await getSessionToken();
  if (token) await signOut(await getDb(), token, new Date());
  const jar = await cookies();
  jar.delete("tv_session");
  jar.delete("__Host-tv_session");
  return respond({ ok: true, value: { signedOut: true } });
});
