"use server";
import { screenAfterRecord } from "@/lib/screening/screening.service";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { recordTitration } from "@/lib/feedstock/titration.service";
import { decideLot, recordLabTest } from "@/lib/feedstock/lot.service";
import { readNumber, readText, readValues, refused } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { LAB_TEST_FIELDS, TITRATION_FIELDS } from "@/app/lab/[code]/fields";

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
  const result = await recordTitration(
    await getDb(),
    { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now },
    {
      lotCode,
      testedAt: who.value.now,
      sampleMassG: readNumber(form, "sampleMassG"),
      titrant: values.titrant || undefined,
      concentrationMolL: readNumber(form, "concentrationMolL"),
      titreMl: readNumber(form, "titreMl"),
      blankMl: readNumber(form, "blankMl") ?? 0,
      basis: values.basis || undefined,
    },
  );
  if (!result.ok)
    return refused(prev, values, result.issues, TITRATION_FIELDS, (f) => (f === "ffaPct" ? "titreMl" : f));
  await screenAfterRecord(
    await getDb(),
    { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now },
    { lotCodes: [lotCode] },
  );
  paths(lotCode);
  return {
    status: "saved",
    message: `Titration saved: FFA ${result.value.ffaPct.toFixed(2)} %, acid value ${result.value.acidValue.toFixed(2)} mg KOH/g.`,
    // Keep the set-up for the next replicate; the titre is new each time.
    values: { ...values, titreMl: "" },
    errors: {},
    seq: prev.seq + 1,
  };
}

export async function recordLabTestAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, LAB_TEST_FIELDS);
  const lotCode = readText(form, "lotCode");
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, LAB_TEST_FIELDS);
  const result = await recordLabTest(
    await getDb(),
    { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now },
    {
      lotCode,
      testedAt: who.value.now,
      kind: values.kind || undefined,
      method: values.method,
      valuePct: readNumber(form, "valuePct"),
    },
  );
  if (!result.ok) return refused(prev, values, result.issues, LAB_TEST_FIELDS);
  await screenAfterRecord(
    await getDb(),
    { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now },
    { lotCodes: [lotCode] },
  );
  paths(lotCode);
  return {
    status: "saved",
    message: `Result saved: ${(values.kind ?? "").toLowerCase()} ${values.valuePct ?? ""} %.`,
    values: { ...values, valuePct: "" },
    errors: {},
    seq: prev.seq + 1,
  };
}

export async function decideLotAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = { status: readText(form, "status") };
  const lotCode = readText(form, "lotCode");
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, ["status"]);
  const result = await decideLot(
    await getDb(),
    { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now },
    { lotCode, status: values.status || undefined },
  );
  if (!result.ok) {
    const state = refused(prev, values, result.issues, ["status"]);
    return { ...state, message: state.errors.status ?? state.message };
  }
  paths(lotCode);
  return {
    status: "saved",
    message: `Lot ${result.value.code} ${result.value.status === "ACCEPTED" ? "accepted for production" : "rejected"}.`,
    values,
    errors: {},
    seq: prev.seq + 1,
  };
}
