"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { holdRecalledProductLots } from "@/lib/trace/recall.service";
import { readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { RECALL_HOLD_FIELDS } from "@/app/trace/recall/fields";

/** Puts every product lot on site that the recall reaches on hold (compliance only). */
export async function holdRecalledAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, RECALL_HOLD_FIELDS);
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, RECALL_HOLD_FIELDS);
  const r = await holdRecalledProductLots(await getDb(), who.value, {
    kind: readText(form, "kind"),
    code: readText(form, "code"),
    from: readText(form, "from"),
    to: readText(form, "to"),
    reason: values.reason,
  });
  if (!r.ok) return refused(prev, values, r.issues, RECALL_HOLD_FIELDS);
  for (const code of r.value.held) revalidatePath(`/products/${encodeURIComponent(code)}`);
  revalidatePath("/products");
  revalidatePath("/trace/recall");
  const n = r.value.held.length;
  return saved(prev, `${n} product lot${n === 1 ? "" : "s"} put on hold: ${r.value.held.join(", ")}.`);
}
