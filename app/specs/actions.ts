"use server";
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { saveSiteSpec } from "@/lib/spec/site-spec.service";
import { readNumber, readText, refused, toNumber } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

// Site specifications are written by compliance staff, checked on the server for each call.

const FIXED = ["baseKey", "name", "customerId", "previousVersion", "reason"] as const;
const LIMIT_FIELD = /^(min|max)\.([a-z0-9-]{1,60})$/;

/** Form field "max.water-sediment" ↔ schema path "limits.water-sediment.max". */
function renameField(field: string): string {
  const m = /^limits\.([a-z0-9-]+)\.(min|max)$/.exec(field);
  return m ? `${m[2]}.${m[1]}` : field;
}

function readLimits(form: FormData): {
  values: Record<string, string>;
  limits: Record<string, { min: number | null; max: number | null }>;
} {
  const values: Record<string, string> = {};
  const limits: Record<string, { min: number | null; max: number | null }> = {};
  for (const [name, raw] of form.entries()) {
    const m = LIMIT_FIELD.exec(name);
    if (!m?.[1] || !m[2] || typeof raw !== "string") continue;
    values[name] = raw.trim();
    const entry = (limits[m[2]] ??= { min: null, max: null });
    entry[m[1] as "min" | "max"] = toNumber(raw) ?? null;
  }
  return { values, limits };
}

export async function saveSiteSpecAction(prev: FormState, form: FormData): Promise<FormState> {
  const { values: limitValues, limits } = readLimits(form);
  const values = { ...Object.fromEntries(FIXED.map((n) => [n, readText(form, n)])), ...limitValues };
  const known = [...FIXED, ...Object.keys(limitValues)];
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, known);
  const customerId = readNumber(form, "customerId");
  const previousVersion = readNumber(form, "previousVersion");
  const r = await saveSiteSpec(await getDb(), actorOf(who.value), {
    baseKey: readText(form, "baseKey"),
    name: readText(form, "name"),
    ...(customerId === undefined ? {} : { customerId }),
    ...(previousVersion === undefined ? {} : { previousVersion }),
    limits,
    reason: readText(form, "reason"),
  });
  if (!r.ok) return refused(prev, values, r.issues, known, renameField);
  revalidatePath("/specs");
  revalidatePath("/specs/site/[id]", "page");
  // The saved version's own page: the version this form started from is no longer current, so its form is gone.
  redirect(`/specs/site/${r.value.id}?saved=1`);
}
