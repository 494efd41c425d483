import "server-only";
import type { Tx } from "@/lib/core/connect";
import { requireHolder } from "@/lib/ledger/ledger.store";
import { reject } from "@/lib/ledger/transaction.store";
import type { HolderKind } from "@/lib/core/vocabulary";

/**
 * The holder to draw from, refusing material that may not be used yet: a feedstock lot must be
 * accepted by the lab, a product lot must not be rejected.
 */
export async function requireDrawableHolder(
  tx: Tx,
  siteId: number,
  kind: HolderKind,
  code: string,
  field: string,
): Promise<number> {
  const holder = await requireHolder(tx, siteId, kind, code, field);
  if (kind === "LOT") {
    const lot = await tx.feedstockLot.findUniqueOrThrow({ where: { holderId: holder.id }, select: { status: true } });
    if (lot.status !== "ACCEPTED")
      reject("LOT.NOT_ACCEPTED", `Lot ${code} is ${lot.status.toLowerCase()}; only accepted lots can be drawn`, field);
  }
  if (kind === "PRODUCT_LOT") {
    const p = await tx.productLot.findUniqueOrThrow({ where: { holderId: holder.id }, select: { status: true } });
    if (p.status === "REJECTED")
      reject("PRODUCT.REJECTED", `Product lot ${code} is rejected and cannot be moved to stock or shipped`, field);
  }
  return holder.id;
}

/** After a draw, a lot that is empty is marked used up. */
export async function markLotConsumedIfEmpty(tx: Tx, holderId: number): Promise<void> {
  const h = await tx.holder.findUniqueOrThrow({ where: { id: holderId }, select: { kind: true, stockG: true } });
  if (h.kind === "LOT" && h.stockG === 0)
    await tx.feedstockLot.update({ where: { holderId }, data: { status: "CONSUMED" } });
}
