"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { getSiteById } from "@/lib/site/site.store";
import { recordShipment } from "@/lib/shipment/shipment.service";
import { readNumber, readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { toSiteInstant } from "@/app/trace/site-time";
import { formFieldOf, lineCountOf, lineFieldNames, SHIPMENT_FIELDS } from "@/app/shipments/form-fields";
import { actorOf } from "@/lib/core/actor";

// Shipments are recorded by compliance staff; checked on the server for each call.

function readLine(form: FormData, n: number): Record<string, unknown> {
  const [kind, code, qty, unit, temp] = lineFieldNames(n);
  const quantity = readNumber(form, qty);
  const litresTyped = readText(form, unit) === "L";
  return {
    fromKind: readText(form, kind) || "PRODUCT_LOT",
    fromCode: readText(form, code),
    ...(litresTyped ? { volumeL: quantity, tempC: readNumber(form, temp) } : { massKg: quantity }),
  };
}

export async function recordShipmentAction(prev: FormState, form: FormData): Promise<FormState> {
  const count = lineCountOf(readText(form, "lineCount"));
  const names = [...SHIPMENT_FIELDS, ...Array.from({ length: count }, (_, i) => lineFieldNames(i + 1)).flat()];
  const values: Record<string, string> = { ...readValues(form, names), lineCount: String(count) };
  const known = [...names];
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, known);
  const db = await getDb();
  const site = await getSiteById(db, who.value.siteId);
  const actor = actorOf(who.value);
  const claim = readText(form, "certifiedClaim");
  const r = await recordShipment(db, actor, {
    documentNo: readText(form, "documentNo"),
    customerCode: readText(form, "customerCode"),
    shippedAt: toSiteInstant(readText(form, "shippedAt"), site?.timeZone ?? "UTC"),
    vehicle: readText(form, "vehicle"),
    compartment: readText(form, "compartment"),
    certifiedClaim: claim === "yes" || claim === "on",
    note: readText(form, "note"),
    lines: Array.from({ length: count }, (_, i) => readLine(form, i + 1)),
  });
  if (!r.ok) {
    // The first reason is repeated beside the button, so it is seen without scrolling back to the line.
    const state = refused(prev, values, r.issues, known, formFieldOf);
    const first = r.issues[0];
    return first?.field !== undefined && state.errors[formFieldOf(first.field)] !== undefined
      ? { ...state, message: `Not saved. ${first.message}` }
      : state;
  }
  revalidatePath("/shipments");
  revalidatePath("/customers");
  return saved(
    prev,
    `Shipment ${r.value.documentNo} recorded: ${(r.value.massG / 1000).toLocaleString("en", { maximumFractionDigits: 3 })} kg left the books.`,
  );
}
