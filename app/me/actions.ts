"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { getSignedIn, requireRole } from "@/lib/auth/request.service";
import { changeOwnPassword, setOwnUnits } from "@/lib/auth/user.service";
import { SITE_ROLES } from "@/lib/core/vocabulary";
import { readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import { redirect } from "next/navigation";
import { homeFor } from "@/lib/auth/read-matrix";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

export async function setOwnUnitsAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, ["unitSystem"]);
  const who = await requireRole(SITE_ROLES);
  if (!who.ok) return refused(prev, values, who.issues, ["unitSystem"]);
  const r = await setOwnUnits(await getDb(), actorOf(who.value), values);
  if (!r.ok) return refused(prev, values, r.issues, ["unitSystem"]);
  revalidatePath("/", "layout");
  return saved(
    prev,
    r.value.unitSystem === "us" ? "Saved: US units (lb, gal, °F)." : "Saved: metric units (kg, L, °C).",
  );
}

/**
 * Anyone signed in sets their own password, including a user held at the first sign-in (so this action
 * checks the session itself rather than through requireRole, which refuses held users). Passwords are
 * never echoed back into the form.
 */
export async function changeOwnPasswordAction(prev: FormState, form: FormData): Promise<FormState> {
  const user = await getSignedIn();
  if (!user) return refused(prev, {}, [{ code: "AUTH.UNAUTHENTICATED", message: "Sign in first" }], []);
  const r = await changeOwnPassword(await getDb(), actorOf(user), {
    current: readText(form, "current"),
    password: readText(form, "password"),
    confirm: readText(form, "confirm"),
  });
  if (!r.ok) return refused(prev, {}, r.issues, ["current", "password", "confirm"]);
  if (user.mustChangePassword) redirect(homeFor(user.role));
  return saved(prev, "Your new password is saved.");
}
