"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/db";
import { requireRole } from "@/lib/auth/request.service";
import { setOwnUnits } from "@/lib/auth/user.service";
import { SITE_ROLES } from "@/lib/ledger/kinds";
import { readValues, refused } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";

export async function setOwnUnitsAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, ["unitSystem"]);
  const who = await requireRole(SITE_ROLES);
  if (!who.ok) return refused(prev, values, who.issues, ["unitSystem"]);
  const r = await setOwnUnits(await getDb(), { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now }, values);
  if (!r.ok) return refused(prev, values, r.issues, ["unitSystem"]);
  revalidatePath("/", "layout");
  return { status: "saved", message: r.value.unitSystem === "us" ? "Saved: US units (lb, gal, °F)." : "Saved: metric units (kg, L, °C).", values: {}, errors: {}, seq: prev.seq + 1 };
}
