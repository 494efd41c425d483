"use server";
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { completeBatch, correctBatchOutput, startBatch } from "@/lib/batch/batch.service";
import { readText, refused, toNumber, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

/** Rows named "<list>.<i>.<field>" → objects in row order; rows left wholly empty are dropped. */
function readRows(
  form: FormData,
  list: string,
  fields: readonly string[],
): { rows: Array<Record<string, string>>; values: Record<string, string> } {
  const byIndex = new Map<number, Record<string, string>>();
  const values: Record<string, string> = {};
  for (const [key, raw] of form.entries()) {
    const m = new RegExp(`^${list}\\.(\\d+)\\.(\\w+)$`).exec(key);
    if (!m || m[1] === undefined || m[2] === undefined || !fields.includes(m[2]) || typeof raw !== "string") continue;
    const row = byIndex.get(Number(m[1])) ?? {};
    row[m[2]] = raw.trim();
    byIndex.set(Number(m[1]), row);
    values[key] = raw.trim();
  }
  const rows = [...byIndex.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([, r]) => r)
    .filter((r) => (r.massKg ?? "") !== "" || (r.fromCode ?? r.toCode ?? "") !== "");
  return { rows, values };
}

/** Service field paths refer to the kept rows; map them back to the form's row numbers. */
function rowFieldMapper(list: string, kept: number[]): (field: string) => string {
  return (field) => {
    const m = new RegExp(`^${list}\\.(\\d+)\\.(\\w+)$`).exec(field);
    if (!m || m[1] === undefined || m[2] === undefined) return field;
    const original = kept[Number(m[1])];
    return original === undefined ? field : `${list}.${original}.${m[2]}`;
  };
}

function keptIndices(form: FormData, list: string, fields: readonly string[]): { known: string[]; kept: number[] } {
  const indices = new Set<number>();
  for (const key of form.keys()) {
    const m = new RegExp(`^${list}\\.(\\d+)\\.`).exec(key);
    if (m?.[1] !== undefined) indices.add(Number(m[1]));
  }
  const sorted = [...indices].sort((a, b) => a - b);
  const kept = sorted.filter((i) => {
    const mass = form.get(`${list}.${i}.massKg`);
    const codeField = form.get(`${list}.${i}.${list === "charges" ? "fromCode" : "toCode"}`);
    return (
      (typeof mass === "string" && mass.trim() !== "") || (typeof codeField === "string" && codeField.trim() !== "")
    );
  });
  return { known: [list, ...sorted.flatMap((i) => fields.map((f) => `${list}.${i}.${f}`))], kept };
}

const CHARGE_FIELDS = ["fromKind", "fromCode", "role", "massKg"] as const;
const OUTPUT_FIELDS = ["role", "toKind", "toCode", "massKg", "reason", "waterFromCode", "waterKg"] as const;

export async function startBatchAction(prev: FormState, form: FormData): Promise<FormState> {
  const batchCode = readText(form, "batchCode");
  const { rows, values } = readRows(form, "charges", CHARGE_FIELDS);
  const { known, kept } = keptIndices(form, "charges", CHARGE_FIELDS);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, known);
  const result = await startBatch(await getDb(), actorOf(who.value), {
    batchCode,
    startedAt: who.value.now,
    charges: rows.map((r) => ({
      fromKind: r.fromKind || undefined,
      fromCode: r.fromCode ?? "",
      role: r.role || undefined,
      massKg: toNumber(r.massKg ?? ""),
    })),
  });
  if (!result.ok) return refused(prev, values, result.issues, known, rowFieldMapper("charges", kept));
  revalidatePath(`/batches/${encodeURIComponent(batchCode)}`);
  revalidatePath(`/batches/${encodeURIComponent(batchCode)}/record`);
  revalidatePath("/batches");
  return saved(
    prev,
    `Batch ${result.value.code} started: ${(result.value.chargedG / 1000).toFixed(3)} kg charged.`,
    values,
  );
}

export async function completeBatchAction(prev: FormState, form: FormData): Promise<FormState> {
  const batchCode = readText(form, "batchCode");
  const { rows, values } = readRows(form, "outputs", OUTPUT_FIELDS);
  const { known, kept } = keptIndices(form, "outputs", OUTPUT_FIELDS);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, known);
  const result = await completeBatch(await getDb(), actorOf(who.value), {
    batchCode,
    completedAt: who.value.now,
    outputs: rows.map((r) => ({
      role: r.role || undefined,
      ...(r.role === "LOSS" || !r.toCode ? {} : { toCode: r.toCode, toKind: r.toKind || undefined }),
      massKg: toNumber(r.massKg ?? ""),
      ...(r.role === "LOSS" ? { reason: r.reason ?? "" } : {}),
      ...(r.role === "WASH_WATER" && (r.waterFromCode || r.waterKg)
        ? {
            ...(r.waterFromCode ? { waterFromCode: r.waterFromCode } : {}),
            ...(r.waterKg ? { waterKg: toNumber(r.waterKg) } : {}),
          }
        : {}),
    })),
  });
  if (!result.ok) return refused(prev, values, result.issues, known, rowFieldMapper("outputs", kept));
  revalidatePath(`/batches/${encodeURIComponent(batchCode)}`);
  revalidatePath(`/batches/${encodeURIComponent(batchCode)}/record`);
  revalidatePath("/batches");
  // The batch page shows the outputs and the computed yield.
  redirect(`/batches/${encodeURIComponent(result.value.code)}`);
}

const CORRECTION_FIELDS = ["movementId", "massKg", "reason"] as const;

/** A finished batch's output typed wrong: booked again with the right mass and a reason; its unmeasured difference follows. */
export async function correctBatchOutputAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = {
    batchCode: readText(form, "batchCode"),
    movementId: readText(form, "movementId"),
    massKg: readText(form, "massKg"),
    reason: readText(form, "reason"),
  };
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, CORRECTION_FIELDS);
  const result = await correctBatchOutput(await getDb(), actorOf(who.value), {
    batchCode: values.batchCode,
    movementId: toNumber(values.movementId),
    massKg: toNumber(values.massKg),
    reason: values.reason,
  });
  if (!result.ok) return refused(prev, values, result.issues, CORRECTION_FIELDS);
  revalidatePath(`/batches/${encodeURIComponent(values.batchCode)}`);
  revalidatePath("/balance");
  const kgText = (result.value.unmeasuredG / 1000).toLocaleString("en", {
    minimumFractionDigits: 3,
    maximumFractionDigits: 3,
  });
  return saved(prev, `Output corrected; the batch's unmeasured difference is now ${kgText} kg.`);
}
