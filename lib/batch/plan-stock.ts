// The planner's view of stock, computed from rows already read: accepted lots with their lab results, and
// feedstock tanks with what they hold now by lot (their stock replayed through the ledger). Pure.
import type { Result } from "@/lib/core/result";
import { traceHolder } from "@/lib/trace/genealogy";
import type { HolderTrace } from "@/lib/trace/genealogy";
import { indexLedger } from "@/lib/ledger/moves";
import type { LedgerIndex } from "@/lib/ledger/moves";
import { convertFfaBasis } from "@/lib/titration/titration";
import type { FfaBasis } from "@/lib/titration/titration";
import type { LotStock, PlanStock, TankShare, TankStock } from "@/lib/batch/plan-candidates";

/** A lot's lab results as the planner needs them. */
export interface LotQuality {
  ffaPct: number | null;
  ffaBasis: FfaBasis;
  waterPct: number | null;
}

export interface LotRef {
  id: number;
  code: string;
  receivedAt: Date;
}

/** Grams a tank holds from one entry holder (a pickup or a lot); null when the entry is not known. */
export interface EntryShare {
  lotHolderId: number | null;
  grams: number;
}

/** The planner blends and compares FFA as oleic (its limits are as oleic); moles are kept (AOCS Ca 5a-40 bases). */
export function ffaAsOleic(r: LotQuality | undefined): number | null {
  return r === undefined || r.ffaPct === null ? null : convertFfaBasis(r.ffaPct, r.ffaBasis, "OLEIC");
}

type Order = "dated" | "booked";

/** The site's holders and movements as the trace index reads them. */
export interface StockLedger {
  holders: Parameters<typeof indexLedger>[0];
  moves: Parameters<typeof indexLedger>[1];
}

/** The ledger indexed once per order and reused for every tank (date order, or booking order when dates are inconsistent). */
function makeIndexer(ledger: StockLedger): (order: Order) => Result<LedgerIndex> {
  const cache = new Map<Order, Result<LedgerIndex>>();
  return (order) => {
    let index = cache.get(order);
    if (index === undefined) {
      index = indexLedger(
        ledger.holders,
        order === "dated" ? ledger.moves : ledger.moves.map((m) => ({ ...m, at: m.id })),
      );
      cache.set(order, index);
    }
    return index;
  };
}

/** What a tank holds now, by origin: its stock composition replayed from the ledger (as the lot pages do). */
function traceStock(
  indexOf: (order: Order) => Result<LedgerIndex>,
  holderId: number,
): { index: LedgerIndex; trace: HolderTrace } | null {
  for (const order of ["dated", "booked"] as const) {
    const index = indexOf(order);
    if (!index.ok) continue;
    const trace = traceHolder(index.value, holderId);
    if (trace.ok) return { index: index.value, trace: trace.value };
  }
  return null;
}

/** Each tank's stock by the holder it entered the site through; null for a tank whose ledger cannot be replayed. */
export function tankEntryShares(
  ledger: StockLedger,
  tanks: ReadonlyArray<{ code: string; holderId: number }>,
): Map<string, EntryShare[] | null> {
  const indexOf = makeIndexer(ledger);
  return new Map(
    tanks.map((t) => {
      const traced = traceStock(indexOf, t.holderId);
      if (traced === null) return [t.code, null];
      const byHolder = new Map<number | null, number>();
      for (const o of traced.trace.stock.origins) {
        const pos = traced.index.positionOf.get(o.originId);
        const entry = pos === undefined ? undefined : traced.index.moves[pos];
        const key = entry?.toHolderId ?? null;
        byHolder.set(key, (byHolder.get(key) ?? 0) + o.grams);
      }
      return [t.code, [...byHolder].map(([lotHolderId, grams]) => ({ lotHolderId, grams }))];
    }),
  );
}

/** Entry holders are pickups (linked to their lot) or the lot itself (deliveries, receiving differences). */
export function lotsByEntryHolder(
  lots: ReadonlyArray<LotRef & { holderId: number }>,
  pickups: ReadonlyArray<{ holderId: number; lotId: number | null }>,
): Map<number, LotRef> {
  const lotById = new Map(lots.map((l) => [l.id, l]));
  const lotOfHolder = new Map<number, LotRef>();
  for (const l of lots) lotOfHolder.set(l.holderId, l);
  for (const p of pickups) {
    const l = p.lotId === null ? undefined : lotById.get(p.lotId);
    if (l) lotOfHolder.set(p.holderId, l);
  }
  return lotOfHolder;
}

/** The lots whose lab results the plan needs: the lots offered and every lot in a tank. */
export function lotsNeeded(
  lotIds: readonly number[],
  tankShares: ReadonlyMap<string, readonly EntryShare[] | null>,
  lotOfHolder: ReadonlyMap<number, LotRef>,
): number[] {
  const needed = new Set<number>(lotIds);
  for (const shares of tankShares.values()) {
    for (const s of shares ?? []) {
      const l = s.lotHolderId === null ? undefined : lotOfHolder.get(s.lotHolderId);
      if (l) needed.add(l.id);
    }
  }
  return [...needed];
}

function tankContents(
  shares: readonly EntryShare[],
  lotOfHolder: ReadonlyMap<number, LotRef>,
  results: ReadonlyMap<number, LotQuality>,
): TankShare[] {
  const byLot = new Map<string, TankShare>();
  for (const s of shares) {
    const l = s.lotHolderId === null ? undefined : lotOfHolder.get(s.lotHolderId);
    const key = l ? l.code : "";
    const r = l ? results.get(l.id) : undefined;
    const share = byLot.get(key) ?? {
      lotCode: l?.code ?? null,
      grams: 0,
      ffaPct: ffaAsOleic(r),
      waterPct: r?.waterPct ?? null,
      receivedAt: l?.receivedAt ?? null,
    };
    share.grams += s.grams;
    byLot.set(key, share);
  }
  return [...byLot.values()].sort((a, b) => b.grams - a.grams || (a.lotCode ?? "").localeCompare(b.lotCode ?? ""));
}

/** Accepted lots with stock and feedstock tanks with their contents by lot, each with FFA as oleic and water. */
export function composePlanStock(input: {
  lots: ReadonlyArray<LotRef & { material: string; stockG: number }>;
  tanks: ReadonlyArray<{ code: string; name: string; stockG: number }>;
  tankShares: ReadonlyMap<string, readonly EntryShare[] | null>;
  lotOfHolder: ReadonlyMap<number, LotRef>;
  results: ReadonlyMap<number, LotQuality>;
}): PlanStock {
  const lots: LotStock[] = input.lots.map((l) => ({
    code: l.code,
    material: l.material,
    receivedAt: l.receivedAt,
    stockG: l.stockG,
    ffaPct: ffaAsOleic(input.results.get(l.id)),
    waterPct: input.results.get(l.id)?.waterPct ?? null,
  }));
  const tanks: TankStock[] = input.tanks.map((t) => {
    const shares = input.tankShares.get(t.code) ?? null;
    return {
      code: t.code,
      name: t.name,
      stockG: t.stockG,
      contents: shares === null ? null : tankContents(shares, input.lotOfHolder, input.results),
    };
  });
  return { lots, tanks };
}
