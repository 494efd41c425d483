// The books brought forward: what every movement dated before an instant adds up to (each stock
// holder's book stock, the holders found below zero on the way, each batch's charges and outputs), so
// a period is computed from its own movements instead of the whole ledger. Carrying the books from one
// instant to a later one walks only the movements dated in between, exactly as the whole-ledger walk
// does (ledger-slots.walkStock, process-view.tallyBatch), so a period computed either way agrees.
import { failMany, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import type { BalanceMove, BatchTally, CarriedBooks } from "@/lib/mass-balance/balance-types";
import { slotLedger, walkStock } from "@/lib/mass-balance/ledger-slots";
import { tallyBatch } from "@/lib/mass-balance/process-view";

/** Which holders the books carry: stock holders (their stock, whether it went below zero) and batches. */
export interface CarriedHolderKinds {
  isStock: (holderId: number) => boolean;
  isBatch: (holderId: number) => boolean;
}

/** Nothing brought forward: the books before the first movement. */
export function emptyBooks(atMs: number): CarriedBooks {
  return { atMs, stockG: new Map(), negativeStock: [], batches: new Map() };
}

function batchTallies(
  from: ReadonlyMap<number, BatchTally>,
  moves: readonly BalanceMove[],
  kinds: CarriedHolderKinds,
): Map<number, BatchTally> {
  const movesOf = new Map<number, BalanceMove[]>();
  const add = (id: number | null, m: BalanceMove): void => {
    if (id === null || !kinds.isBatch(id)) return;
    const list = movesOf.get(id);
    if (list === undefined) movesOf.set(id, [m]);
    else list.push(m);
  };
  for (const m of moves) {
    add(m.toHolderId, m);
    if (m.fromHolderId !== m.toHolderId) add(m.fromHolderId, m);
  }
  const batches = new Map(from);
  for (const [id, list] of movesOf) batches.set(id, tallyBatch(id, list, from.get(id)));
  return batches;
}

/**
 * The books carried from `from` to `toMs` over `moves` (those dated in [from.atMs, toMs) are used; the
 * ledger's checks apply to them). Reversed pairs must already be left out, as in the whole-ledger read.
 */
export function carryBooks(
  from: CarriedBooks,
  moves: readonly BalanceMove[],
  toMs: number,
  kinds: CarriedHolderKinds,
): Result<CarriedBooks> {
  const window = moves.filter((m) => m.at >= from.atMs && m.at < toMs);
  const ids = new Set<number>(from.stockG.keys());
  for (const n of from.negativeStock) ids.add(n.holderId);
  for (const m of window) {
    ids.add(m.toHolderId);
    if (m.fromHolderId !== null) ids.add(m.fromHolderId);
  }
  const holders = [...ids].map((id) => ({ id }));
  const slots = slotLedger(holders, window);
  if (slots.issues.length > 0) return failMany(slots.issues);
  const watched = new Uint8Array(holders.length);
  holders.forEach((h, i) => (watched[i] = kinds.isStock(h.id) ? 1 : 0));
  const { closing, negativeStock } = walkStock(window, slots, holders, toMs, toMs, watched, from);
  const stockG = new Map<number, number>();
  holders.forEach((h, i) => {
    const g = closing[i] ?? 0;
    if (g !== 0 && watched[i] === 1) stockG.set(h.id, g);
  });
  return ok({ atMs: toMs, stockG, negativeStock, batches: batchTallies(from.batches, window, kinds) });
}
