"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { changeCustomer, createCustomer } from "@/lib/customer/customer.service";
import { readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

// Customers are recorded and changed by compliance staff; checked on the server for each call.

const NEW_FIELDS = ["code", "name", "address", "contact"] as const;
const CHANGE_FIELDS = ["code", "name", "address", "contact", "active", "reason"] as const;

export async function createCustomerAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, NEW_FIELDS);
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, NEW_FIELDS);
  const actor = actorOf(who.value);
  const r = await createCustomer(await getDb(), actor, {
    code: values.code,
    name: values.name,
    address: values.address,
    contact: values.contact,
  });
  if (!r.ok) return refused(prev, values, r.issues, NEW_FIELDS);
  revalidatePath("/customers");
  return saved(prev, `Customer ${r.value.code} recorded.`);
}

export async function changeCustomerAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, CHANGE_FIELDS);
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, CHANGE_FIELDS);
  const actor = actorOf(who.value);
  const active = readText(form, "active");
  const r = await changeCustomer(await getDb(), actor, {
    code: values.code,
    name: values.name,
    address: values.address,
    contact: values.contact,
    active: active === "yes" || active === "on",
    reason: values.reason,
  });
  if (!r.ok) return refused(prev, values, r.issues, CHANGE_FIELDS);
  revalidatePath("/customers");
  revalidatePath(`/customers/${encodeURIComponent(r.value.code)}`);
  return saved(
    prev,
    `Customer ${r.value.code} changed (${r.value.changed.join(", ")}); the history keeps the old values.`,
  );
}
