"use server";
import { redirect } from "next/navigation";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { recordPlannedBatch } from "@/lib/batch/plan.service";
import { readText, refused } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { paramsFromQueryString, planRequestFromParams } from "@/app/plan/plan-query";
import { actorOf } from "@/lib/core/actor";

export async function recordPlanAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = { code: readText(form, "code"), notes: readText(form, "notes") };
  const query = readText(form, "query");
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, ["code", "notes"]);
  const request = { ...planRequestFromParams(paramsFromQueryString(query)), code: values.code, notes: values.notes };
  const result = await recordPlannedBatch(await getDb(), actorOf(who.value), request);
  if (!result.ok) return refused(prev, values, result.issues, ["code", "notes"]);
  revalidatePath("/batches");
  redirect(`/batches/${encodeURIComponent(result.value.code)}`);
}
