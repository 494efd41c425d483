// The ledger as the balance walks it: every movement checked and its holders numbered by position, book
// stock before an instant, and one walk giving opening and closing stock and the first negative stock.
import type { DomainIssue } from "@/lib/core/result";
import { MOVE_ROLES } from "@/lib/core/vocabulary";
import type { BalanceHolder, BalanceMove, CarriedBooks, NegativeStock } from "@/lib/mass-balance/balance-types";

/** Checks the ledger itself: known holders, positive whole grams, valid instants, no move to itself. */
export function validateLedger(holders: readonly BalanceHolder[], moves: readonly BalanceMove[]): DomainIssue[] {
  return slotLedger(holders, moves).issues;
}

/** Checks one movement and finds its holders' slots (-1: enters the books here; -2: unknown holder). */
function checkMove(
  m: BalanceMove,
  i: number,
  slotFor: (id: number) => number,
  roles: ReadonlySet<string>,
  issues: DomainIssue[],
): { fromSlot: number; toSlot: number } {
  if (!Number.isSafeInteger(m.massG) || m.massG <= 0) {
    issues.push({
      code: "MASS_BALANCE.INVALID_MASS",
      message: `Movement ${m.id}: mass must be a whole number of grams above 0, got ${m.massG}`,
      field: `moves.${i}.massG`,
    });
  }
  if (!Number.isSafeInteger(m.at)) {
    issues.push({
      code: "MASS_BALANCE.INVALID_TIME",
      message: `Movement ${m.id}: time must be an instant in milliseconds`,
      field: `moves.${i}.at`,
    });
  }
  if (!roles.has(m.role)) {
    issues.push({
      code: "MASS_BALANCE.UNKNOWN_ROLE",
      message: `Movement ${m.id}: unknown role ${m.role}`,
      field: `moves.${i}.role`,
    });
  }
  const fromSlot = m.fromHolderId === null ? -1 : slotFor(m.fromHolderId);
  if (fromSlot === -2) {
    issues.push({
      code: "MASS_BALANCE.UNKNOWN_HOLDER",
      message: `Movement ${m.id}: from-holder ${m.fromHolderId} is not in the list`,
      field: `moves.${i}.fromHolderId`,
    });
  }
  const toSlot = slotFor(m.toHolderId);
  if (toSlot === -2) {
    issues.push({
      code: "MASS_BALANCE.UNKNOWN_HOLDER",
      message: `Movement ${m.id}: to-holder ${m.toHolderId} is not in the list`,
      field: `moves.${i}.toHolderId`,
    });
  }
  if (m.fromHolderId === m.toHolderId) {
    issues.push({
      code: "MASS_BALANCE.SELF_MOVE",
      message: `Movement ${m.id}: from and to are the same holder`,
      field: `moves.${i}.toHolderId`,
    });
  }
  return { fromSlot, toSlot };
}

/**
 * Checks the ledger and numbers each movement's holders by their position in `holders` (-1 for "enters
 * the books here"), so the passes below index typed arrays instead of maps.
 */
export function slotLedger(
  holders: readonly { id: number }[],
  moves: readonly BalanceMove[],
): { issues: DomainIssue[]; from: Int32Array; to: Int32Array } {
  const issues: DomainIssue[] = [];
  const slotOf = new Map<number, number>();
  for (let i = 0; i < holders.length; i++) {
    const h = holders[i] as { id: number };
    if (slotOf.has(h.id))
      issues.push({
        code: "MASS_BALANCE.DUPLICATE_HOLDER",
        message: `Holder ${h.id} is listed twice`,
        field: `holders.${i}.id`,
      });
    else slotOf.set(h.id, i);
  }
  // Holder ids are database ids, dense from 1: look them up in an array when they are.
  let maxId = -1;
  for (const h of holders)
    maxId = Number.isSafeInteger(h.id) && h.id >= 0 ? Math.max(maxId, h.id) : Number.POSITIVE_INFINITY;
  const dense = maxId <= 4 * holders.length + 1024 ? new Int32Array(maxId + 1).fill(-2) : null;
  if (dense !== null) for (const [id, slot] of slotOf) dense[id] = slot;
  const slotFor = (id: number): number =>
    dense !== null
      ? Number.isInteger(id) && id >= 0 && id <= maxId
        ? (dense[id] as number)
        : -2
      : (slotOf.get(id) ?? -2);
  const roles = new Set<string>(MOVE_ROLES);
  const from = new Int32Array(moves.length);
  const to = new Int32Array(moves.length);
  for (let i = 0; i < moves.length; i++) {
    const { fromSlot, toSlot } = checkMove(moves[i] as BalanceMove, i, slotFor, roles, issues);
    from[i] = fromSlot;
    to[i] = toSlot;
  }
  return { issues, from, to };
}

/** Book stock of every holder at instant `t` (movements with at < t). */
export function stockBefore(moves: readonly BalanceMove[], t: number, inclusive = false): Map<number, number> {
  const s = new Map<number, number>();
  for (const m of moves) {
    if (inclusive ? m.at > t : m.at >= t) continue;
    s.set(m.toHolderId, (s.get(m.toHolderId) ?? 0) + m.massG);
    if (m.fromHolderId !== null) s.set(m.fromHolderId, (s.get(m.fromHolderId) ?? 0) - m.massG);
  }
  return s;
}

/** Positions of the movements dated in [fromMs, endMs), in (time, id) order; a ledger read in that order is not sorted again. */
function timeOrder(moves: readonly BalanceMove[], fromMs: number, endMs: number): Int32Array {
  const all = new Int32Array(moves.length);
  let count = 0;
  let sorted = true;
  for (let i = 0; i < moves.length; i++) {
    const m = moves[i] as BalanceMove;
    if (m.at >= endMs || m.at < fromMs) continue;
    const prev = count === 0 ? undefined : moves[all[count - 1] as number];
    if (prev !== undefined && (prev.at > m.at || (prev.at === m.at && prev.id > m.id))) sorted = false;
    all[count++] = i;
  }
  const order = all.subarray(0, count);
  if (!sorted)
    order.sort(
      (a, b) =>
        (moves[a] as BalanceMove).at - (moves[b] as BalanceMove).at ||
        (moves[a] as BalanceMove).id - (moves[b] as BalanceMove).id,
    );
  return order;
}

/** The walk's starting point: the books brought forward (stock, and holders found below zero), or nothing. */
function startingPoint(holders: readonly { id: number }[], watched: Uint8Array, carried: CarriedBooks | undefined) {
  const running = new Float64Array(holders.length);
  const found = new Uint8Array(holders.length);
  const negativeStock: NegativeStock[] = [];
  if (carried === undefined) return { running, found, negativeStock, fromMs: Number.NEGATIVE_INFINITY };
  const slotOf = new Map<number, number>();
  holders.forEach((h, i) => slotOf.set(h.id, i));
  for (const [id, g] of carried.stockG) {
    const slot = slotOf.get(id);
    if (slot !== undefined) running[slot] = g;
  }
  for (const n of carried.negativeStock) {
    const slot = slotOf.get(n.holderId);
    if (slot === undefined || watched[slot] !== 1) continue;
    found[slot] = 1;
    negativeStock.push(n);
  }
  return { running, found, negativeStock, fromMs: carried.atMs };
}

/**
 * One walk of the ledger in (time, id) order up to `endMs`: every holder's book stock before `startMs`
 * (opening) and before `endMs` (closing), and the first movement at which each watched holder's stock
 * is below zero. All movements stamped at the same instant are applied before checking, so their order
 * within the instant does not matter. With books brought forward, the walk starts from them and leaves
 * out the movements dated before them.
 */
export function walkStock(
  moves: readonly BalanceMove[],
  slots: { from: Int32Array; to: Int32Array },
  holders: readonly { id: number }[],
  startMs: number,
  endMs: number,
  watched: Uint8Array,
  carried?: CarriedBooks,
): { opening: Float64Array; closing: Float64Array; negativeStock: NegativeStock[] } {
  const { running, found, negativeStock, fromMs } = startingPoint(holders, watched, carried);
  const order = timeOrder(moves, fromMs, endMs);
  let opening: Float64Array | null = null;
  for (let g = 0; g < order.length;) {
    const at = (moves[order[g] as number] as BalanceMove).at;
    if (opening === null && at >= startMs) opening = running.slice();
    let end = g;
    for (; end < order.length && (moves[order[end] as number] as BalanceMove).at === at; end++) {
      const i = order[end] as number;
      const massG = (moves[i] as BalanceMove).massG;
      running[slots.to[i] as number] = (running[slots.to[i] as number] as number) + massG;
      const f = slots.from[i] as number;
      if (f >= 0) running[f] = (running[f] as number) - massG;
    }
    for (let k = g; k < end; k++) {
      const i = order[k] as number;
      const f = slots.from[i] as number;
      if (f < 0 || found[f] === 1 || watched[f] !== 1) continue;
      const balanceG = running[f] as number;
      if (balanceG < 0) {
        found[f] = 1;
        negativeStock.push({
          holderId: (holders[f] as { id: number }).id,
          at,
          moveId: (moves[i] as BalanceMove).id,
          balanceG,
        });
      }
    }
    g = end;
  }
  return { opening: opening ?? running.slice(), closing: running, negativeStock };
}
