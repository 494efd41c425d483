import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import type { Where } from "@/lib/grid/grid-query";

/** The filtered row count and the sums within the filter, in one aggregate query (one scan, not two). */
export async function sumOf(
  db: Db | Tx,
  model: "pickup" | "feedstockLot" | "batch" | "movement" | "productLot" | "shipment" | "disposal",
  where: Where,
  fields: string[],
): Promise<{ count: number; sums: Record<string, number> }> {
  const _sum = Object.fromEntries(fields.map((f) => [f, true]));
  // The aggregate arguments have the same shape for every model; the delegate types differ only by name.
  const delegate = db[model] as unknown as {
    aggregate(args: {
      where: Where;
      _sum: Record<string, boolean>;
      _count: true;
    }): Promise<{ _sum: Record<string, number | null>; _count: number }>;
  };
  const r = await delegate.aggregate({ where, _sum, _count: true });
  return { count: r._count, sums: Object.fromEntries(fields.map((f) => [f, r._sum[f] ?? 0])) };
}
