import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db, Tx } from "@/lib/core/connect";
import type { DomainIssue, Result } from "@/lib/core/result";
import { failMany } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import { parseInput } from "@/lib/ledger/parse";
import { assertPeriodOpen, createHolder, postMovement } from "@/lib/ledger/ledger.store";
import { reject, Rejection, runInTransaction } from "@/lib/ledger/transaction.store";
import { DEFAULT_DENSITY_TABLE, requireDensityEntry } from "@/lib/quantity/density";
import type { Actor } from "@/lib/core/actor";
import { getCustomer } from "@/lib/customer/customer.store";
import { lineQuantity, shipmentTotals } from "@/lib/shipment/lines";
import type { LineQuantity } from "@/lib/shipment/lines";
import { ShipmentRecordSchema } from "@/lib/shipment/shipment.schema";
import type { ShipmentLine } from "@/lib/shipment/shipment.schema";
import { getDrawSource, insertShipmentRecord, shipmentExists } from "@/lib/shipment/shipment.store";

type PricedLine = Pick<ShipmentLine, "fromKind" | "fromCode"> & {
  quantity: LineQuantity;
  index: number;
  qtyField: string;
};

/** "Line 2: " when a shipment has several lines, so a refusal says which one; nothing for a single line. */
function linePrefix(index: number, count: number): string {
  return count > 1 ? `Line ${index + 1}: ` : "";
}

function priceLines(
  lines: readonly ShipmentLine[],
): { ok: true; value: PricedLine[] } | { ok: false; issues: DomainIssue[] } {
  const fame = requireDensityEntry(DEFAULT_DENSITY_TABLE, "FAME");
  const issues: DomainIssue[] = [];
  const priced: PricedLine[] = [];
  lines.forEach((l, index) => {
    const q = lineQuantity(l, fame);
    const qtyField = `lines.${index}.${l.massKg === undefined ? "volumeL" : "massKg"}`;
    if (q.ok) priced.push({ fromKind: l.fromKind, fromCode: l.fromCode, quantity: q.value, index, qtyField });
    else
      issues.push(
        ...q.issues.map((i) => ({
          ...i,
          message: `${linePrefix(index, lines.length)}${i.message}`,
          field: `lines.${index}.${i.field ?? "massKg"}`,
        })),
      );
  });
  return issues.length > 0 ? { ok: false, issues } : { ok: true, value: priced };
}

/** Only released product leaves the site; a tank line must be a product tank (which holds released fuel only). */
async function requireShippable(tx: Tx, actor: Actor, l: PricedLine, count: number): Promise<number> {
  const field = `lines.${l.index}.fromCode`;
  const p = linePrefix(l.index, count);
  const src = await getDrawSource(tx, actor.siteId, l.fromKind, l.fromCode);
  if (!src)
    reject(
      "RECORD.NOT_FOUND",
      `${p}${l.fromKind === "TANK" ? "Tank" : "Product lot"} ${l.fromCode} does not exist`,
      field,
    );
  if (l.fromKind === "PRODUCT_LOT") {
    if (src.productStatus === "HELD")
      reject(
        "PRODUCT.ON_HOLD",
        `${p}Product lot ${l.fromCode} is on hold: it cannot leave the site until it is released`,
        field,
      );
    if (src.productStatus === "REJECTED")
      reject("PRODUCT.REJECTED", `${p}Product lot ${l.fromCode} is rejected: it cannot leave the site`, field);
    if (src.productStatus !== "RELEASED")
      reject("PRODUCT.NOT_RELEASED", `${p}Product lot ${l.fromCode} is not released`, field);
  } else if (src.tankService !== "PRODUCT") {
    reject(
      "SHIPMENT.NOT_PRODUCT_TANK",
      `${p}Tank ${l.fromCode} holds ${labelOf(src.tankService ?? "").toLowerCase()}, not finished fuel`,
      field,
    );
  }
  return src.holderId;
}

/** A movement's refusal (over-draw, over-draw in time) with the line it belongs to named in front. */
async function postLine(tx: Tx, run: () => Promise<number>, prefix: string): Promise<number> {
  try {
    return await run();
  } catch (e) {
    if (e instanceof Rejection && prefix !== "")
      throw new Rejection(e.issues.map((i) => ({ ...i, message: `${prefix}${i.message}` })));
    throw e;
  }
}

/** The customer the shipment goes to, which must exist and be active. */
async function requireActiveCustomer(tx: Tx, siteId: number, code: string) {
  const customer = await getCustomer(tx, siteId, code);
  if (!customer) reject("RECORD.NOT_FOUND", `Customer ${code} does not exist`, "customerCode");
  if (!customer.active)
    reject(
      "CUSTOMER.INACTIVE",
      `Customer ${customer.name} is no longer active; reactivate the customer first`,
      "customerCode",
    );
  return customer;
}

/**
 * Records one shipment to a customer: a shipment holder receives one movement per line, all in one
 * transaction — any refused line (held or rejected lot, over-draw, closed period) leaves nothing written.
 */
export async function recordShipment(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ id: number; documentNo: string; massG: number }>> {
  const parsed = parseInput(ShipmentRecordSchema, input);
  if (!parsed.ok) return parsed;
  const s = parsed.value;
  const pricing = priceLines(s.lines);
  if (!pricing.ok) return failMany(pricing.issues);
  const priced = pricing.value;
  const totals = shipmentTotals(priced.map((l) => l.quantity));
  return runInTransaction(db, async (tx) => {
    await assertPeriodOpen(tx, actor.siteId, s.shippedAt, "shippedAt");
    if (await shipmentExists(tx, actor.siteId, s.documentNo))
      reject("RECORD.DUPLICATE", `Document number ${s.documentNo} is already used by another shipment`, "documentNo");
    const customer = await requireActiveCustomer(tx, actor.siteId, s.customerCode);
    const sources: number[] = [];
    for (const l of priced) sources.push(await requireShippable(tx, actor, l, priced.length));
    const holderId = await createHolder(tx, actor.siteId, "SHIPMENT", s.documentNo, "documentNo");
    const saved = await insertShipmentRecord(tx, {
      siteId: actor.siteId,
      holderId,
      documentNo: s.documentNo,
      customer: customer.name,
      customerId: customer.id,
      shippedAt: s.shippedAt,
      massG: totals.massG,
      volumeMl: totals.volumeMl,
      certifiedClaim: s.certifiedClaim,
      vehicle: s.vehicle,
      compartment: s.compartment,
    });
    for (const [i, l] of priced.entries()) {
      const fromHolderId = sources[i] ?? 0;
      await postLine(
        tx,
        () =>
          postMovement(tx, {
            siteId: actor.siteId,
            at: s.shippedAt,
            role: "SHIPMENT",
            fromHolderId,
            toHolderId: holderId,
            massG: l.quantity.massG,
            volumeMl: l.quantity.volumeMl,
            tempC: l.quantity.tempC,
            note: s.note,
            recordedById: actor.userId,
            field: l.qtyField,
          }),
        linePrefix(i, priced.length),
      );
    }
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "Shipment",
      entityKey: s.documentNo,
      after: {
        ...s,
        customer: customer.name,
        massG: totals.massG,
        volumeMl: totals.volumeMl,
        lines: priced.map((l) => ({
          fromKind: l.fromKind,
          fromCode: l.fromCode,
          massG: l.quantity.massG,
          volumeMl: l.quantity.volumeMl,
          tempC: l.quantity.tempC,
        })),
      },
    });
    return { ...saved, massG: totals.massG };
  });
}
