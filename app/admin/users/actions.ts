"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { changeUser, createUser, endSessions, resetPassword, unlockSignIn } from "@/lib/auth/user.service";
import { readText, readValues, refused } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

// Every account change is an administrator's, checked here on the server for each call.

const CREATE_FIELDS = ["login", "fullName", "role", "unitSystem", "password"] as const;
const CHANGE_FIELDS = ["login", "role", "active", "unitSystem", "reason"] as const;
const RESET_FIELDS = ["login", "password", "reason"] as const;

function saved(prev: FormState, message: string): FormState {
  revalidatePath("/admin/users");
  return { status: "saved", message, values: {}, errors: {}, seq: prev.seq + 1 };
}

export async function createUserAction(prev: FormState, form: FormData): Promise<FormState> {
  // The password is never echoed back into the form after a refusal.
  const values: Record<string, string> = { ...readValues(form, CREATE_FIELDS), password: "" };
  const who = await requireRole(["ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, CREATE_FIELDS);
  const input = {
    login: readText(form, "login"),
    fullName: readText(form, "fullName"),
    role: readText(form, "role"),
    unitSystem: readText(form, "unitSystem") || undefined,
    password: rawText(form, "password"),
  };
  const r = await createUser(await getDb(), actorOf(who.value), input);
  if (!r.ok) return refused(prev, values, r.issues, CREATE_FIELDS);
  return saved(prev, `Account ${r.value.login} created; give them the password in person.`);
}

export async function changeUserAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, CHANGE_FIELDS);
  const who = await requireRole(["ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, CHANGE_FIELDS);
  const input = {
    login: values.login,
    reason: values.reason,
    ...(values.role ? { role: values.role } : {}),
    ...(values.unitSystem ? { unitSystem: values.unitSystem } : {}),
    ...(values.active === "yes" ? { active: true } : values.active === "no" ? { active: false } : {}),
  };
  const r = await changeUser(await getDb(), actorOf(who.value), input);
  if (!r.ok) return refused(prev, values, r.issues, CHANGE_FIELDS);
  return saved(
    prev,
    `${r.value.login} changed${r.value.sessionsEnded > 0 ? `; ${r.value.sessionsEnded} session${r.value.sessionsEnded === 1 ? "" : "s"} ended` : ""}.`,
  );
}

export async function resetPasswordAction(prev: FormState, form: FormData): Promise<FormState> {
  const values: Record<string, string> = { ...readValues(form, RESET_FIELDS), password: "" };
  const who = await requireRole(["ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, RESET_FIELDS);
  const r = await resetPassword(await getDb(), actorOf(who.value), {
    login: readText(form, "login"),
    reason: readText(form, "reason"),
    password: rawText(form, "password"),
  });
  if (!r.ok) return refused(prev, values, r.issues, RESET_FIELDS);
  return saved(
    prev,
    `New password set for ${r.value.login}; ${r.value.sessionsEnded} session${r.value.sessionsEnded === 1 ? "" : "s"} ended.`,
  );
}

export async function endSessionsAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, ["login", "reason"]);
  const who = await requireRole(["ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, ["login", "reason"]);
  const r = await endSessions(await getDb(), actorOf(who.value), {
    login: readText(form, "login"),
    reason: values.reason,
  });
  if (!r.ok) return refused(prev, values, r.issues, ["login", "reason"]);
  return saved(
    prev,
    `${r.value.sessionsEnded} session${r.value.sessionsEnded === 1 ? "" : "s"} of ${r.value.login} ended; they must sign in again.`,
  );
}

export async function unlockSignInAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, ["login", "reason"]);
  const who = await requireRole(["ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, ["login", "reason"]);
  const r = await unlockSignIn(await getDb(), actorOf(who.value), {
    login: readText(form, "login"),
    reason: values.reason,
  });
  if (!r.ok) return refused(prev, values, r.issues, ["login", "reason"]);
  return saved(prev, `${r.value.login} may sign in again at once; earlier failed attempts no longer count.`);
}

/** A password exactly as typed (not trimmed: spaces may be part of it). */
function rawText(form: FormData, name: string): string {
  const v = form.get(name);
  return typeof v === "string" ? v : "";
}
