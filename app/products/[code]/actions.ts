"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { chooseProductSpec, decideProductLot, recordQcResult } from "@/lib/product/product.service";
import { getSiteById } from "@/lib/site/site.store";
import { labelOf } from "@/lib/core/vocabulary";
import { readNumber, readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { toSiteInstant } from "@/app/trace/site-time";
import { DECISION_FIELDS, QC_FIELDS, SPEC_FIELDS } from "@/app/products/[code]/fields";

// QC results are entered by the lab (production) or compliance; the specification and every decision
// are compliance's. Each action checks the role on the server before anything else.

function paths(code: string): void {
  revalidatePath(`/products/${encodeURIComponent(code)}`);
  revalidatePath("/products");
}

const VERDICT_WORDS: Record<string, string> = {
  PASS: "within limits",
  FAIL: "OUT OF LIMITS",
  REPORTED: "recorded (report only)",
  NOT_JUDGED: "recorded, not judged",
};

export async function recordQcResultAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, QC_FIELDS);
  const code = readText(form, "productLotCode");
  const who = await requireRole(["PRODUCTION", "COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, QC_FIELDS);
  const db = await getDb();
  const site = await getSiteById(db, who.value.siteId);
  const r = await recordQcResult(db, who.value, {
    productLotCode: code,
    property: values.property,
    value: readNumber(form, "value"),
    method: values.method,
    lab: values.lab,
    reportNo: values.reportNo,
    testedAt: toSiteInstant(values.testedAt ?? "", site?.timeZone ?? "UTC"),
  });
  if (!r.ok) return refused(prev, values, r.issues, QC_FIELDS, (f) => (f === "productLotCode" ? "property" : f));
  paths(code);
  const retest = r.value.supersedesId === null ? "" : " It replaces the earlier result, which stays on record.";
  // Keep the lab, report number and date for the next property of the same report.
  return saved(
    prev,
    `${r.value.property}: ${values.value} saved, ${VERDICT_WORDS[r.value.verdict] ?? labelOf(r.value.verdict)}.${retest}`,
    { lab: values.lab ?? "", reportNo: values.reportNo ?? "", testedAt: values.testedAt ?? "" },
  );
}

export async function chooseProductSpecAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, SPEC_FIELDS);
  const code = readText(form, "productLotCode");
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, SPEC_FIELDS);
  const r = await chooseProductSpec(await getDb(), who.value, { productLotCode: code, specKey: values.specKey });
  if (!r.ok) return refused(prev, values, r.issues, SPEC_FIELDS, (f) => (f === "productLotCode" ? "specKey" : f));
  paths(code);
  return saved(
    prev,
    `Specification changed; results are judged against it now${r.value.releasable ? " and the lot can be released" : ""}.`,
    values,
  );
}

const DECIDED_WORDS: Record<string, string> = { RELEASED: "released", HELD: "put on hold", REJECTED: "rejected" };

export async function decideProductLotAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, DECISION_FIELDS);
  const code = readText(form, "productLotCode");
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, DECISION_FIELDS);
  const r = await decideProductLot(await getDb(), who.value, {
    productLotCode: code,
    decision: values.decision || undefined,
    reason: values.reason,
  });
  if (!r.ok) {
    const state = refused(prev, values, r.issues, DECISION_FIELDS, (f) => (f === "productLotCode" ? "decision" : f));
    return { ...state, message: state.errors.decision ?? state.message };
  }
  paths(code);
  return saved(
    prev,
    `Product lot ${r.value.code} ${DECIDED_WORDS[r.value.status] ?? labelOf(r.value.status).toLowerCase()}${r.value.deviation ? " with a deviation" : ""}.`,
  );
}
