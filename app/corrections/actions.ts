"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { reverseMovement, voidLabResult } from "@/lib/correction/correction.service";
import { readNumber, readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

// Corrections by production staff, checked on the server for each call; the reason is required.

export async function reverseMovementAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, ["movementId", "reason"]);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, ["movementId", "reason"]);
  const r = await reverseMovement(await getDb(), actorOf(who.value), {
    movementId: readNumber(form, "movementId"),
    reason: readText(form, "reason"),
  });
  if (!r.ok) return refused(prev, values, r.issues, ["reason"]);
  revalidatePath("/ledger");
  revalidatePath("/batches/[code]", "page");
  return saved(prev, `Movement ${r.value.movementId} reversed by movement ${r.value.reversalId}.`);
}

export async function voidLabResultAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, ["kind", "resultId", "reason"]);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, ["reason"]);
  const r = await voidLabResult(await getDb(), actorOf(who.value), {
    kind: readText(form, "kind"),
    resultId: readNumber(form, "resultId"),
    reason: readText(form, "reason"),
  });
  if (!r.ok) return refused(prev, values, r.issues, ["reason"]);
  revalidatePath(`/lab/${encodeURIComponent(r.value.lotCode)}`);
  revalidatePath(`/lots/${encodeURIComponent(r.value.lotCode)}`);
  return saved(prev, "Result voided; it stays on record and no longer counts.");
}
