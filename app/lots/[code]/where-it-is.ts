// Where a lot's material is held now, by kind of place: what the lot page's "Where it is now" table
// shows. Pure: the lot's flow in, rows out.
import type { LotFlow } from "@/lib/feedstock/lot-detail.store";

export interface HeldByKind {
  kind: string;
  places: number;
  heldG: number;
}

/**
 * Grams held anywhere now, summed by kind of place and largest first; places holding nothing are left
 * out. With what is still in the lot, the total adds up to what reached the places and stayed there.
 */
export function heldByKind(flow: Pick<LotFlow, "destinations" | "stillInLotG">): {
  rows: HeldByKind[];
  totalG: number;
} {
  const byKind = new Map<string, HeldByKind>();
  for (const d of flow.destinations) {
    if (d.heldG === null || d.heldG === 0) continue;
    const k = byKind.get(d.holder.kind) ?? { kind: d.holder.kind, places: 0, heldG: 0 };
    k.places += 1;
    k.heldG += d.heldG;
    byKind.set(d.holder.kind, k);
  }
  const rows = [...byKind.values()].sort((a, b) => b.heldG - a.heldG);
  return { rows, totalG: rows.reduce((s, k) => s + k.heldG, flow.stillInLotG) };
}
