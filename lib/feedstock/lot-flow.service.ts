import "server-only";
// Record pages' genealogy (a lot's "where it went", a batch's or product lot's "made of") computed on
// the site's cached trace index and snapshots, so at ten years of history a page costs a warm trace,
// not a whole-ledger read and replay.
import type { Db } from "@/lib/core/connect";
import { loadTraceLedger } from "@/lib/ledger/movement.store";
import { describeLotFlow, describeMadeOf, timeOrderedFlow } from "@/lib/feedstock/lot-detail.store";
import type { LotFlow, MadeOf } from "@/lib/feedstock/lot-detail.store";
import { traceLotMaterial, traceReceived } from "@/lib/trace/trace.service";

/** Where a lot's material went; when the ledger cannot be replayed, every later move out of a holder it reached. */
export async function getLotFlow(db: Db, siteId: number, lotHolderId: number, now: Date): Promise<LotFlow> {
  const traced = await traceLotMaterial(db, siteId, lotHolderId, now);
  if (traced.ok) {
    const t = traced.value;
    return describeLotFlow(
      db,
      siteId,
      t.ledger,
      lotHolderId,
      t.index,
      t,
      t.order === "dated" ? "trace" : "booking-order",
      t.orderProblem,
    );
  }
  const problem = traced.issues.map((i) => i.message.replace(/\.$/, "")).join("; ");
  return timeOrderedFlow(db, siteId, await loadTraceLedger(db, siteId), lotHolderId, problem);
}

/** What a batch, product lot or shipment was made of, by feedstock and reagent lot; null when the ledger cannot be replayed. */
export async function getMadeOf(db: Db, siteId: number, holderId: number, now: Date): Promise<MadeOf | null> {
  const traced = await traceReceived(db, siteId, holderId, now);
  if (!traced.ok) return null;
  return describeMadeOf(db, siteId, traced.value, traced.value.back, traced.value.order);
}
