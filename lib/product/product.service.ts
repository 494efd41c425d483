import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import { z } from "zod";
import type { Db } from "@/lib/database/connect";
import type { Result } from "@/lib/errors";
import { parseInput } from "@/lib/ledger/parse";
import { code } from "@/lib/ledger/fields";
import { createHolder, postMovement, reject, requireHolder, runInTransaction } from "@/lib/ledger/ledger.store";
import { requireDrawableHolder } from "@/lib/ledger/draw.store";
import { QcResultSchema, ShipmentSchema } from "@/lib/product/product.schema";
import { toGrams, toMillilitres } from "@/lib/quantity/units";
import type { Actor } from "@/lib/site/actor";
import { getProductState, insertQcResult, insertShipment, setProductStatus } from "@/lib/product/product.store";

export function qcPasses(value: number, limitMin: number | undefined, limitMax: number | undefined): boolean {
  return (limitMin === undefined || value >= limitMin) && (limitMax === undefined || value <= limitMax);
}

export async function recordQcResult(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; pass: boolean }>> {
  const parsed = parseInput(QcResultSchema, input);
  if (!parsed.ok) return parsed;
  const q = parsed.value;
  return runInTransaction(db, async (tx) => {
    const holder = await requireHolder(tx, actor.siteId, "PRODUCT_LOT", q.productLotCode, "productLotCode");
    const lot = await getProductState(tx, holder.id);
    if (lot.status !== "HELD") reject("PRODUCT.DECIDED", `Product lot ${q.productLotCode} is already ${lot.status.toLowerCase()}`, "productLotCode");
    const pass = qcPasses(q.value, q.limitMin, q.limitMax);
    const saved = await insertQcResult(tx, { productLotId: lot.id, property: q.property, method: q.method, value: q.value, unit: q.unit, limitMin: q.limitMin ?? null, limitMax: q.limitMax ?? null, specRef: q.specRef, pass, testedAt: q.testedAt });
    await appendAudit(tx, actor, { action: "CREATE", entity: "QcResult", entityKey: q.productLotCode, after: { ...q, pass } });
    return saved;
  });
}

export const ReleaseSchema = z.object({ productLotCode: code("Product lot"), decision: z.enum(["RELEASED", "REJECTED"], { error: "Decision: release or reject" }) });

/** Release needs at least one QC result and every result within its limits. */
export async function decideProductLot(db: Db, actor: Actor, input: unknown): Promise<Result<{ code: string; status: string }>> {
  const parsed = parseInput(ReleaseSchema, input);
  if (!parsed.ok) return parsed;
  const d = parsed.value;
  return runInTransaction(db, async (tx) => {
    const holder = await requireHolder(tx, actor.siteId, "PRODUCT_LOT", d.productLotCode, "productLotCode");
    const lot = await getProductState(tx, holder.id);
    if (lot.status !== "HELD") reject("PRODUCT.DECIDED", `Product lot ${d.productLotCode} is already ${lot.status.toLowerCase()}`, "decision");
    if (d.decision === "RELEASED") {
      if (lot.qc.length === 0) reject("PRODUCT.NO_QC", "Release needs QC results first", "decision");
      const failed = lot.qc.filter((q) => !q.pass).map((q) => q.property);
      if (failed.length) reject("PRODUCT.QC_FAILED", `Cannot release: out of limits for ${failed.join(", ")}`, "decision");
    }
    await setProductStatus(tx, lot.id, d.decision, d.decision === "RELEASED" ? actor.now : null);
    await appendAudit(tx, actor, { action: d.decision === "RELEASED" ? "RELEASE" : "REJECT", entity: "ProductLot", entityKey: d.productLotCode, before: { status: lot.status }, after: { status: d.decision } });
    return { code: d.productLotCode, status: d.decision };
  });
}

/** Only released product leaves the site; a product tank is assumed to hold released product only. */
export async function shipProduct(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; documentNo: string }>> {
  const parsed = parseInput(ShipmentSchema, input);
  if (!parsed.ok) return parsed;
  const s = parsed.value;
  return runInTransaction(db, async (tx) => {
    const from = await requireDrawableHolder(tx, actor.siteId, s.fromKind, s.fromCode, "fromCode");
    if (s.fromKind === "PRODUCT_LOT") {
      const p = await getProductState(tx, from);
      if (p.status !== "RELEASED") reject("PRODUCT.NOT_RELEASED", `Product lot ${s.fromCode} is not released`, "fromCode");
    }
    const holderId = await createHolder(tx, actor.siteId, "SHIPMENT", s.documentNo);
    const massG = toGrams(s.massKg);
    const shipment = await insertShipment(tx, { siteId: actor.siteId, holderId, documentNo: s.documentNo, customer: s.customer, shippedAt: s.shippedAt, massG, volumeMl: toMillilitres(s.volumeL), certifiedClaim: s.certifiedClaim });
    await postMovement(tx, { siteId: actor.siteId, at: s.shippedAt, role: "SHIPMENT", fromHolderId: from, toHolderId: holderId, massG, volumeMl: toMillilitres(s.volumeL), note: s.note, recordedById: actor.userId });
    await appendAudit(tx, actor, { action: "CREATE", entity: "Shipment", entityKey: s.documentNo, after: { ...s, massG } });
    return shipment;
  });
}
