"use server";
import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import { getDb } from "@/lib/core/db";
import { signIn, signOut } from "@/lib/auth/session.service";
import { cookieIsSecure, getSessionToken, sessionCookieName } from "@/lib/auth/request.service";

export interface SignInState {
  login: string;
  message: string | null;
  field: string | null;
}

/** Only paths inside this app are followed after sign-in. */
function safeNext(next: FormDataEntryValue | null): string {
  const s = typeof next === "string" ? next : "";
  return s.startsWith("/") && !s.startsWith("//") && !s.startsWith("/login") ? s : "/";
}

export async function signInAction(_prev: SignInState, form: FormData): Promise<SignInState> {
  const typedLogin = form.get("login");
  const typedPassword = form.get("password");
  const login = typeof typedLogin === "string" ? typedLogin : "";
  const h = await headers();
  const ip = (h.get("x-forwarded-for") ?? "").split(",")[0]?.trim() || "local";
  const result = await signIn(
    await getDb(),
    { login, password: typeof typedPassword === "string" ? typedPassword : "" },
    { ip, now: new Date() },
  );
  if (!result.ok) {
    const issue = result.issues[0];
    return { login, message: issue?.message ?? "Sign-in failed", field: issue?.field ?? null };
  }
  const jar = await cookies();
  jar.set(await sessionCookieName(), result.value.token, {
    httpOnly: true,
    secure: await cookieIsSecure(),
    sameSite: "lax",
    path: "/",
    expires: result.value.expiresAt,
  });
  redirect(safeNext(form.get("next")));
}

export async function signOutAction(): Promise<void> {
  const token = await getSessionToken();
  if (token) await signOut(await getDb(), token, new Date());
  const jar = await cookies();
  jar.delete("tv_session");
  jar.delete("__Host-tv_session");
  redirect("/login");
}
