"use server";
import { screenAfterRecord } from "@/lib/screening/screening.service";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { recordTitration } from "@/lib/feedstock/titration.service";
import { decideLot, recordLabTest } from "@/lib/feedstock/lot.service";
import { readNumber, readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { LAB_TEST_FIELDS, TITRATION_FIELDS } from "@/app/lab/[code]/fields";
import { actorOf } from "@/lib/core/actor";

function paths(lotCode: string): void {
  revalidatePath(`/lab/${encodeURIComponent(lotCode)}`);
  revalidatePath("/lab");
  revalidatePath(`/lots/${encodeURIComponent(lotCode)}`);
}

export async function recordTitrationAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, TITRATION_FIELDS);
  const lotCode = readText(form, "lotCode");
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, TITRATION_FIELDS);
  const result = await recordTitration(await getDb(), actorOf(who.value), {
    lotCode,
    testedAt: who.value.now,
    sampleMassG: readNumber(form, "sampleMassG"),
    titrant: values.titrant || undefined,
    concentrationMolL: readNumber(form, "concentrationMolL"),
    titreMl: readNumber(form, "titreMl"),
    blankMl: readNumber(form, "blankMl") ?? 0,
    basis: values.basis || undefined,
  });
  if (!result.ok)
    return refused(prev, values, result.issues, TITRATION_FIELDS, (f) => (f === "ffaPct" ? "titreMl" : f));
  await screenAfterRecord(await getDb(), actorOf(who.value), { lotCodes: [lotCode] });
  paths(lotCode);
  // Keep the set-up for the next replicate; the titre is new each time.
  return saved(
    prev,
    `Titration saved: FFA ${result.value.ffaPct.toFixed(2)} %, acid value ${result.value.acidValue.toFixed(2)} mg KOH/g.`,
    { ...values, titreMl: "" },
  );
}

export async function recordLabTestAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, LAB_TEST_FIELDS);
  const lotCode = readText(form, "lotCode");
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, LAB_TEST_FIELDS);
  const result = await recordLabTest(await getDb(), actorOf(who.value), {
    lotCode,
    testedAt: who.value.now,
    kind: values.kind || undefined,
    method: values.method,
    valuePct: readNumber(form, "valuePct"),
  });
  if (!result.ok) return refused(prev, values, result.issues, LAB_TEST_FIELDS);
  await screenAfterRecord(await getDb(), actorOf(who.value), { lotCodes: [lotCode] });
  paths(lotCode);
  return saved(prev, `Result saved: ${(values.kind ?? "").toLowerCase()} ${values.valuePct ?? ""} %.`, {
    ...values,
    valuePct: "",
  });
}

export async function decideLotAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = { status: readText(form, "status") };
  const lotCode = readText(form, "lotCode");
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, ["status"]);
  const result = await decideLot(await getDb(), actorOf(who.value), { lotCode, status: values.status || undefined });
  if (!result.ok) {
    const state = refused(prev, values, result.issues, ["status"]);
    return { ...state, message: state.errors.status ?? state.message };
  }
  paths(lotCode);
  return saved(
    prev,
    `Lot ${result.value.code} ${result.value.status === "ACCEPTED" ? "accepted for production" : "rejected"}.`,
    values,
  );
}
