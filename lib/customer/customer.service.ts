import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import type { Actor } from "@/lib/core/actor";
import { CustomerChangeSchema, CustomerSchema } from "@/lib/customer/customer.schema";
import { getCustomer, insertCustomer, updateCustomer } from "@/lib/customer/customer.store";

export async function createCustomer(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ id: number; code: string }>> {
  const parsed = parseInput(CustomerSchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    if (await getCustomer(tx, actor.siteId, c.code))
      reject("RECORD.DUPLICATE", `Customer code ${c.code} is already used`, "code");
    const saved = await insertCustomer(tx, {
      siteId: actor.siteId,
      code: c.code,
      name: c.name,
      address: c.address,
      contact: c.contact,
      createdAt: actor.now,
    });
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "Customer",
      entityKey: c.code,
      after: { ...c, active: true },
    });
    return saved;
  });
}

/** Changes a customer's name, address, contact or active state; the audit trail keeps before, after and the reason. */
export async function changeCustomer(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; changed: string[] }>> {
  const parsed = parseInput(CustomerChangeSchema, input);
  if (!parsed.ok) return parsed;
  const { reason, ...next } = parsed.value;
  return runInTransaction(db, async (tx) => {
    const current = await getCustomer(tx, actor.siteId, next.code);
    if (!current) reject("RECORD.NOT_FOUND", `Customer ${next.code} does not exist`, "code");
    const before = { name: current.name, address: current.address, contact: current.contact, active: current.active };
    const after = { name: next.name, address: next.address, contact: next.contact, active: next.active };
    const changed = (Object.keys(after) as Array<keyof typeof after>).filter((k) => before[k] !== after[k]);
    if (changed.length === 0)
      reject("CUSTOMER.UNCHANGED", "Nothing was changed: edit a field or the active mark first", "name");
    await updateCustomer(tx, current.id, after);
    const pick = (o: typeof before) => Object.fromEntries(changed.map((k) => [k, o[k]]));
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "Customer",
      entityKey: next.code,
      before: pick(before),
      after: pick(after),
      reason,
    });
    return { code: next.code, changed };
  });
}
