"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { setClosureTolerance, setWaterLimits } from "@/lib/mass-balance/site-limits.service";
import { readNumber, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

// The site's own limits: compliance and administrators change them, each with a reason; the balance,
// the batch pages and the planner read the newest at once.

const CLOSURE_FIELDS = ["warnPct", "failPct", "reason"] as const;
const WATER_FIELDS = ["baseStepPct", "acidStepPct", "reason"] as const;

function revalidateReaders(): void {
  revalidatePath("/limits");
  revalidatePath("/balance");
  revalidatePath("/batches", "layout");
  revalidatePath("/plan", "layout");
}

export async function setClosureToleranceAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, CLOSURE_FIELDS);
  const who = await requireRole(["COMPLIANCE", "ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, CLOSURE_FIELDS);
  const actor = actorOf(who.value);
  const r = await setClosureTolerance(await getDb(), actor, {
    warnPct: readNumber(form, "warnPct"),
    failPct: readNumber(form, "failPct"),
    reason: values.reason,
  });
  if (!r.ok) return refused(prev, values, r.issues, CLOSURE_FIELDS);
  revalidateReaders();
  return saved(prev, "Closure tolerance saved: batches and balances are flagged against it from now on.");
}

export async function setWaterLimitsAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, WATER_FIELDS);
  const who = await requireRole(["COMPLIANCE", "ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, WATER_FIELDS);
  const actor = actorOf(who.value);
  const r = await setWaterLimits(await getDb(), actor, {
    baseStepPct: readNumber(form, "baseStepPct"),
    acidStepPct: readNumber(form, "acidStepPct"),
    reason: values.reason,
  });
  if (!r.ok) return refused(prev, values, r.issues, WATER_FIELDS);
  revalidateReaders();
  return saved(prev, "Water limits saved: the planner and the recipe warnings use them from now on.");
}
