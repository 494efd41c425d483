"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { setGs1CompanyPrefix } from "@/lib/site/site-settings.service";
import { readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

const FIELDS = ["gs1CompanyPrefix", "reason"] as const;

/** The administrator sets or clears the plant's GS1 Company Prefix. */
export async function setGs1PrefixAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, FIELDS);
  const who = await requireRole(["ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, FIELDS);
  const r = await setGs1CompanyPrefix(await getDb(), actorOf(who.value), values);
  if (!r.ok) return refused(prev, values, r.issues, FIELDS);
  revalidatePath("/admin/site");
  const message =
    r.value.gs1CompanyPrefix === null
      ? "No GS1 Company Prefix: exports use the site's own identifiers."
      : `GS1 Company Prefix ${r.value.gs1CompanyPrefix} saved: exports and lot labels now use GS1 identifiers.`;
  return saved(prev, message);
}
