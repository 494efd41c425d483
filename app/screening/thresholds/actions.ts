"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { changeScreeningSetting } from "@/lib/screening/screening-settings.service";
import { SCREENING_SETTING_LABELS } from "@/lib/screening/screening-defaults";
import type { ScreeningSettingKey } from "@/lib/screening/screening-defaults";
import { readNumber, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

const FIELDS = ["setting", "value", "reason"] as const;

/** Compliance (or the administrator) changes one source-check threshold, with a reason. */
export async function changeThresholdAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, FIELDS);
  const who = await requireRole(["COMPLIANCE", "ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, FIELDS);
  const r = await changeScreeningSetting(await getDb(), actorOf(who.value), {
    setting: values.setting,
    value: readNumber(form, "value"),
    reason: values.reason,
  });
  if (!r.ok) return refused(prev, values, r.issues, FIELDS);
  revalidatePath("/screening", "layout");
  const label = SCREENING_SETTING_LABELS[values.setting as ScreeningSettingKey] ?? "Threshold";
  return saved(prev, `${label} is now ${values.value}; the next checks use it.`);
}
