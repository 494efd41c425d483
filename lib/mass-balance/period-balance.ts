// Period mass balance over the movement ledger, in integer grams so every identity is exact:
//   stock view:   opening + receipts + transfers in + returns = outputs + transfers out + closing
//   process view: batch inputs (oil + reagents) = batch outputs (ester, glycerol phase, wash water,
//                 recovered methanol, recorded losses) + unaccounted
// and book stock against measured tank gauges.
import { failMany, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { BATCH_INPUT_ROLES, BATCH_OUTPUT_ROLES, MOVE_ROLES } from "@/lib/core/vocabulary";
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";
import { computeDifferences } from "@/lib/mass-balance/differences";
import type {
  BalanceHolder,
  BalanceMove,
  Closure,
  ClosureFlag,
  ClosureTolerance,
  ReceiptClass,
} from "@/lib/mass-balance/balance-types";
export type {
  BalanceHolder,
  BalanceMove,
  Closure,
  ClosureFlag,
  ClosureTolerance,
  ReceiptClass,
} from "@/lib/mass-balance/balance-types";
import type { Differences, GaugeDifference } from "@/lib/mass-balance/differences";

/** STOCK holders hold material on site; OUT holders are where material leaves the books (cumulative). */
export type HolderClass = "STOCK" | "OUT";

export const DEFAULT_HOLDER_CLASSES: Readonly<Record<HolderKind, HolderClass>> = {
  PICKUP: "STOCK", // collected, not yet received into a lot
  DELIVERY: "STOCK",
  LOT: "STOCK",
  TANK: "STOCK",
  BATCH: "STOCK", // a batch in progress holds what was charged and not yet drawn off
  PRODUCT_LOT: "STOCK",
  WASTE_CONTAINER: "STOCK",
  REAGENT_LOT: "STOCK",
  SHIPMENT: "OUT",
  DISPOSAL: "OUT",
  LOSS: "OUT",
  DIFFERENCE: "OUT",
};

export const RECEIPT_CLASS_BY_KIND: Readonly<Record<HolderKind, ReceiptClass>> = {
  PICKUP: "FEEDSTOCK",
  DELIVERY: "FEEDSTOCK",
  LOT: "FEEDSTOCK",
  TANK: "FEEDSTOCK",
  REAGENT_LOT: "REAGENT",
  BATCH: "OTHER",
  PRODUCT_LOT: "OTHER",
  WASTE_CONTAINER: "OTHER",
  SHIPMENT: "OTHER",
  DISPOSAL: "OTHER",
  LOSS: "OTHER",
  DIFFERENCE: "OTHER",
};

export const DEFAULT_CLOSURE_TOLERANCE: ClosureTolerance = {
  warnPct: 0.5,
  failPct: 2,
  source: "common practice, no source",
  note: "Period mass-balance closure: warn above 0.5 %, fail above 2 % of inputs. A site setting; change it to what your scheme or auditor accepts.",
};

export interface BalanceScope {
  siteId: number;
  /** Only stock holders carrying this material kind are in scope. */
  materialKind?: string;
  holderClasses?: Readonly<Record<HolderKind, HolderClass>>;
}

export interface PeriodBalanceInput {
  holders: readonly BalanceHolder[];
  moves: readonly BalanceMove[];
  period: { startMs: number; endMs: number };
  scope: BalanceScope;
  tolerance?: ClosureTolerance;
  /** Book against measured stock of gauged tanks at the period end (latest reading), for the differences. */
  gauges?: readonly GaugeDifference[];
}

export interface RoleFlow {
  /** Entered the scope's stock (receipts, transfers in, returns). */
  inG: number;
  /** Left the scope's stock (outputs, transfers out). */
  outG: number;
  /** Moved between holders inside the scope. */
  internalG: number;
}

export interface HolderStock {
  holderId: number;
  kind: HolderKind;
  openingG: number;
  closingG: number;
}

export interface NegativeStock {
  holderId: number;
  at: number;
  moveId: number;
  balanceG: number;
}

export interface StockView {
  openingG: number;
  receipts: { totalG: number; feedstockG: number; reagentG: number; otherG: number; unmeasuredG: number };
  /** From stock holders outside the scope (another site or material kind). */
  transfersInG: number;
  /** From OUT holders back into stock (e.g. a returned shipment). */
  returnsG: number;
  outputs: { totalG: number; shipmentG: number; disposalG: number; lossG: number; unmeasuredG: number; otherG: number };
  transfersOutG: number;
  closingG: number;
  deltaStockG: number;
  /** opening + receipts + transfers in + returns − outputs − transfers out − closing; 0 when every movement is recorded. */
  imbalanceG: number;
  closure: Closure;
  byRole: Record<MoveRole, RoleFlow>;
  /** In-scope holders with stock at the start or the end of the period (every other one is empty at both ends). */
  byHolder: HolderStock[];
  /** Holders whose book stock dropped below zero at some movement up to the period end: a movement in is missing. */
  negativeStock: NegativeStock[];
}

export interface BatchBalance {
  holderId: number;
  completedAt: number | null;
  /** Charges (oil and reagents); an unmeasured gain is not an input. */
  inputsG: number;
  /** Measured outputs and recorded losses; the booked unmeasured difference is not an output. */
  outputsG: number;
  /** inputs − measured outputs: the unmeasured difference of a finished batch, still held for one in progress. */
  imbalanceG: number;
  /** The unmeasured difference as booked (out to the site's difference account, less any unmeasured gain). */
  unmeasuredG: number;
  inputsByRole: Partial<Record<MoveRole, number>>;
  outputsByRole: Partial<Record<MoveRole, number>>;
  /** Roles other than the usual batch input/output roles that touched the batch. */
  unusualRoles: MoveRole[];
  closure: Closure;
}

export interface ProcessView {
  /** Batches finished inside the period, with all their movements up to the period end. */
  completed: BatchBalance[];
  /** Batches with movements before the period end and not finished by then (not flagged). */
  inProgress: BatchBalance[];
  inputsG: number;
  outputsG: number;
  imbalanceG: number;
  inputsByRole: Partial<Record<MoveRole, number>>;
  outputsByRole: Partial<Record<MoveRole, number>>;
  closure: Closure;
}

export interface PeriodBalance {
  period: { startMs: number; endMs: number };
  scope: { siteId: number; materialKind: string | null };
  tolerance: ClosureTolerance;
  stock: StockView;
  process: ProcessView;
  /** Unmeasured batch differences, receiving differences and gauge-vs-book differences, flagged: the closure that can fail. */
  differences: Differences;
}

const CLOSURE_EPS = 1e-9;

function exceedsPct(absG: number, baseG: number, pct: number): boolean {
  const limitG = (pct * baseG) / 100;
  return absG - limitG > CLOSURE_EPS * Math.max(1, limitG);
}

/** Flags |imbalance| against a tolerance expressed as a percentage of `baseG`. */
export function classifyClosure(imbalanceG: number, baseG: number, tolerance: ClosureTolerance): Closure {
  const abs = Math.abs(imbalanceG);
  if (baseG <= 0) return { imbalanceG, baseG, pct: null, flag: abs === 0 ? "OK" : "FAIL" };
  const pct = (imbalanceG * 100) / baseG;
  const flag: ClosureFlag = exceedsPct(abs, baseG, tolerance.failPct)
    ? "FAIL"
    : exceedsPct(abs, baseG, tolerance.warnPct)
      ? "WARN"
      : "OK";
  return { imbalanceG, baseG, pct, flag };
}

export function validateTolerance(tolerance: ClosureTolerance, field = "tolerance"): DomainIssue[] {
  const issues: DomainIssue[] = [];
  for (const key of ["warnPct", "failPct"] as const) {
    const v = tolerance[key];
    if (!Number.isFinite(v) || v < 0 || v > 100) {
      issues.push({
        code: "MASS_BALANCE.INVALID_TOLERANCE",
        message: `${key} must be between 0 and 100 %, got ${v}`,
        field: `${field}.${key}`,
      });
    }
  }
  if (issues.length === 0 && tolerance.warnPct > tolerance.failPct) {
    issues.push({
      code: "MASS_BALANCE.INVALID_TOLERANCE",
      message: "Warn level must not be above the fail level",
      field: `${field}.warnPct`,
    });
  }
  return issues;
}

/** Checks the ledger itself: known holders, positive whole grams, valid instants, no move to itself. */
export function validateLedger(holders: readonly BalanceHolder[], moves: readonly BalanceMove[]): DomainIssue[] {
  return slotLedger(holders, moves).issues;
}

/**
 * Checks the ledger and numbers each movement's holders by their position in `holders` (-1 for "enters
 * the books here"), so the passes below index typed arrays instead of maps.
 */
function slotLedger(
  holders: readonly BalanceHolder[],
  moves: readonly BalanceMove[],
): { issues: DomainIssue[]; from: Int32Array; to: Int32Array } {
  const issues: DomainIssue[] = [];
  const slotOf = new Map<number, number>();
  for (let i = 0; i < holders.length; i++) {
    const h = holders[i] as BalanceHolder;
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
    const m = moves[i] as BalanceMove;
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
    from[i] = fromSlot;
    to[i] = toSlot;
  }
  return { issues, from, to };
}

function emptyRoleFlows(): Record<MoveRole, RoleFlow> {
  return Object.fromEntries(MOVE_ROLES.map((r) => [r, { inG: 0, outG: 0, internalG: 0 }])) as Record<
    MoveRole,
    RoleFlow
  >;
}

function addTo<K extends string>(rec: Partial<Record<K, number>>, key: K, g: number): void {
  rec[key] = (rec[key] ?? 0) + g;
}

/** Book stock of every holder at instant `t` (movements with at < t). */
function stockBefore(moves: readonly BalanceMove[], t: number, inclusive = false): Map<number, number> {
  const s = new Map<number, number>();
  for (const m of moves) {
    if (inclusive ? m.at > t : m.at >= t) continue;
    s.set(m.toHolderId, (s.get(m.toHolderId) ?? 0) + m.massG);
    if (m.fromHolderId !== null) s.set(m.fromHolderId, (s.get(m.fromHolderId) ?? 0) - m.massG);
  }
  return s;
}

/**
 * One walk of the ledger in (time, id) order up to `endMs`: every holder's book stock before `startMs`
 * (opening) and before `endMs` (closing), and the first movement at which each watched holder's stock
 * is below zero. All movements stamped at the same instant are applied before checking, so their order
 * within the instant does not matter.
 */
function walkStock(
  moves: readonly BalanceMove[],
  slots: { from: Int32Array; to: Int32Array },
  holders: readonly BalanceHolder[],
  startMs: number,
  endMs: number,
  watched: Uint8Array,
): { opening: Float64Array; closing: Float64Array; negativeStock: NegativeStock[] } {
  // Positions in (time, id) order; a ledger read in that order (the usual case) is not sorted again.
  const all = new Int32Array(moves.length);
  let count = 0;
  let sorted = true;
  for (let i = 0; i < moves.length; i++) {
    const m = moves[i] as BalanceMove;
    if (m.at >= endMs) continue;
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
  const running = new Float64Array(holders.length);
  let opening: Float64Array | null = null;
  const found = new Uint8Array(holders.length);
  const negativeStock: NegativeStock[] = [];
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
          holderId: (holders[f] as BalanceHolder).id,
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

/** Mass balance of one site (optionally one material kind) over [startMs, endMs). */
export function computePeriodBalance(input: PeriodBalanceInput): Result<PeriodBalance> {
  const { holders, moves, period, scope } = input;
  const tolerance = input.tolerance ?? DEFAULT_CLOSURE_TOLERANCE;
  const slots = slotLedger(holders, moves);
  const issues = [...slots.issues, ...validateTolerance(tolerance)];
  if (!Number.isSafeInteger(period.startMs) || !Number.isSafeInteger(period.endMs) || period.endMs <= period.startMs) {
    issues.push({
      code: "MASS_BALANCE.INVALID_PERIOD",
      message: "Period end must be after its start",
      field: "period.endMs",
    });
  }
  if (issues.length > 0) return failMany(issues);

  const classes = scope.holderClasses ?? DEFAULT_HOLDER_CLASSES;
  const inScope = (h: BalanceHolder): boolean =>
    classes[h.kind] === "STOCK" &&
    h.siteId === scope.siteId &&
    (scope.materialKind === undefined || h.materialKind === scope.materialKind);
  const scopedSlot = new Uint8Array(holders.length);
  holders.forEach((h, i) => (scopedSlot[i] = inScope(h) ? 1 : 0));

  // Stock view: opening and closing stock and negative stock in one walk.
  const { opening, closing, negativeStock } = walkStock(
    moves,
    slots,
    holders,
    period.startMs,
    period.endMs,
    scopedSlot,
  );
  const byHolder: HolderStock[] = [];
  holders.forEach((h, i) => {
    const openingG = opening[i] ?? 0;
    const closingG = closing[i] ?? 0;
    if (scopedSlot[i] === 1 && (openingG !== 0 || closingG !== 0))
      byHolder.push({ holderId: h.id, kind: h.kind, openingG, closingG });
  });
  const scoped = holders.filter((_h, i) => scopedSlot[i] === 1);
  const openingG = byHolder.reduce((s, h) => s + h.openingG, 0);
  const closingG = byHolder.reduce((s, h) => s + h.closingG, 0);

  const receipts = { totalG: 0, feedstockG: 0, reagentG: 0, otherG: 0, unmeasuredG: 0 };
  const outputs = { totalG: 0, shipmentG: 0, disposalG: 0, lossG: 0, unmeasuredG: 0, otherG: 0 };
  let transfersInG = 0;
  let transfersOutG = 0;
  let returnsG = 0;
  const byRole = emptyRoleFlows();

  for (let i = 0; i < moves.length; i++) {
    const m = moves[i] as BalanceMove;
    if (m.at < period.startMs || m.at >= period.endMs) continue;
    const toSlot = slots.to[i] as number;
    const fromSlot = slots.from[i] as number;
    const to = holders[toSlot] as BalanceHolder;
    const from = fromSlot < 0 ? null : (holders[fromSlot] as BalanceHolder);
    const toIn = scopedSlot[toSlot] === 1;
    const fromIn = fromSlot >= 0 && scopedSlot[fromSlot] === 1;
    const flow = byRole[m.role];
    if (fromIn && toIn) {
      flow.internalG += m.massG;
    } else if (toIn) {
      flow.inG += m.massG;
      if (from === null) {
        receipts.totalG += m.massG;
        const rc = to.receiptClass ?? RECEIPT_CLASS_BY_KIND[to.kind];
        if (m.role === "UNMEASURED") receipts.unmeasuredG += m.massG;
        else if (rc === "FEEDSTOCK") receipts.feedstockG += m.massG;
        else if (rc === "REAGENT") receipts.reagentG += m.massG;
        else receipts.otherG += m.massG;
      } else if (classes[from.kind] === "OUT") {
        returnsG += m.massG;
      } else {
        transfersInG += m.massG;
      }
    } else if (fromIn) {
      flow.outG += m.massG;
      if (classes[to.kind] === "OUT") {
        outputs.totalG += m.massG;
        if (to.kind === "SHIPMENT") outputs.shipmentG += m.massG;
        else if (to.kind === "DISPOSAL") outputs.disposalG += m.massG;
        else if (to.kind === "LOSS") outputs.lossG += m.massG;
        else if (to.kind === "DIFFERENCE") outputs.unmeasuredG += m.massG;
        else outputs.otherG += m.massG;
      } else {
        transfersOutG += m.massG;
      }
    }
  }

  const stockInG = receipts.totalG + transfersInG + returnsG;
  const imbalanceG = openingG + stockInG - outputs.totalG - transfersOutG - closingG;

  const stock: StockView = {
    openingG,
    receipts,
    transfersInG,
    returnsG,
    outputs,
    transfersOutG,
    closingG,
    deltaStockG: closingG - openingG,
    imbalanceG,
    closure: classifyClosure(imbalanceG, stockInG, tolerance),
    byRole,
    byHolder,
    negativeStock,
  };

  return ok({
    period: { startMs: period.startMs, endMs: period.endMs },
    scope: { siteId: scope.siteId, materialKind: scope.materialKind ?? null },
    tolerance,
    stock,
    process: computeProcessView(
      scoped.filter((h) => h.kind === "BATCH"),
      moves,
      period,
      tolerance,
    ),
    differences: computeDifferences({
      holders,
      moves,
      period,
      inScope,
      ...(input.gauges ? { gauges: input.gauges } : {}),
      baseG: stockInG,
      tolerance,
      classify: classifyClosure,
    }),
  });
}

const USUAL_INPUTS = new Set<MoveRole>(BATCH_INPUT_ROLES);
const USUAL_OUTPUTS = new Set<MoveRole>(BATCH_OUTPUT_ROLES);

function computeProcessView(
  batches: readonly BalanceHolder[],
  moves: readonly BalanceMove[],
  period: { startMs: number; endMs: number },
  tolerance: ClosureTolerance,
): ProcessView {
  const completed: BatchBalance[] = [];
  const inProgress: BatchBalance[] = [];
  const totalIn: Partial<Record<MoveRole, number>> = {};
  const totalOut: Partial<Record<MoveRole, number>> = {};
  let inputsG = 0;
  let outputsG = 0;

  // One pass over the ledger, bucketing the movements into and out of each batch still relevant to
  // the period (not finished before it), instead of one pass per batch.
  const relevant = batches.filter(
    (b) => b.completedAt === null || b.completedAt === undefined || b.completedAt >= period.startMs,
  );
  const movesOf = new Map<number, BalanceMove[]>(relevant.map((b) => [b.id, []]));
  for (const m of moves) {
    if (m.at >= period.endMs) continue;
    movesOf.get(m.toHolderId)?.push(m);
    if (m.fromHolderId !== null) movesOf.get(m.fromHolderId)?.push(m);
  }

  for (const b of relevant) {
    const completedAt = b.completedAt ?? null;
    const finishedInPeriod = completedAt !== null && completedAt < period.endMs;
    const inputsByRole: Partial<Record<MoveRole, number>> = {};
    const outputsByRole: Partial<Record<MoveRole, number>> = {};
    const unusual = new Set<MoveRole>();
    let bin = 0;
    let bout = 0;
    let unmeasuredG = 0;
    let touched = false;
    for (const m of movesOf.get(b.id) ?? []) {
      if (m.role === "UNMEASURED") {
        unmeasuredG += m.fromHolderId === b.id ? m.massG : -m.massG;
      } else if (m.toHolderId === b.id) {
        touched = true;
        bin += m.massG;
        addTo(inputsByRole, m.role, m.massG);
        if (!USUAL_INPUTS.has(m.role)) unusual.add(m.role);
      } else if (m.fromHolderId === b.id) {
        touched = true;
        bout += m.massG;
        addTo(outputsByRole, m.role, m.massG);
        if (!USUAL_OUTPUTS.has(m.role)) unusual.add(m.role);
      }
    }
    if (!touched && !finishedInPeriod) continue;
    const row: BatchBalance = {
      holderId: b.id,
      completedAt,
      inputsG: bin,
      outputsG: bout,
      imbalanceG: bin - bout,
      unmeasuredG,
      inputsByRole,
      outputsByRole,
      unusualRoles: [...unusual].sort(),
      closure: classifyClosure(bin - bout, bin, tolerance),
    };
    if (finishedInPeriod) {
      completed.push(row);
      inputsG += bin;
      outputsG += bout;
      for (const r of MOVE_ROLES) {
        const gIn = inputsByRole[r];
        const gOut = outputsByRole[r];
        if (gIn !== undefined) addTo(totalIn, r, gIn);
        if (gOut !== undefined) addTo(totalOut, r, gOut);
      }
    } else {
      inProgress.push(row);
    }
  }

  return {
    completed,
    inProgress,
    inputsG,
    outputsG,
    imbalanceG: inputsG - outputsG,
    inputsByRole: totalIn,
    outputsByRole: totalOut,
    closure: classifyClosure(inputsG - outputsG, inputsG, tolerance),
  };
}

export interface GaugeReading {
  holderId: number;
  at: number;
  /** Measured mass in the tank, whole grams (from level, temperature and density). */
  massG: number;
}

export interface GaugeComparison {
  holderId: number;
  at: number;
  bookG: number;
  measuredG: number;
  /** measured − book: negative means less in the tank than the books say. */
  differenceG: number;
  closure: Closure;
}

export interface GaugeReport {
  rows: GaugeComparison[];
  /** Over the latest reading of each holder. */
  total: { bookG: number; measuredG: number; differenceG: number; closure: Closure };
  tolerance: ClosureTolerance;
}

/**
 * Book stock against measured gauge readings, flagged as a share of book stock. A movement stamped at
 * the same millisecond as a reading counts as done before the reading.
 */
export function compareBookToGauges(input: {
  holders: readonly BalanceHolder[];
  moves: readonly BalanceMove[];
  readings: readonly GaugeReading[];
  tolerance?: ClosureTolerance;
  holderClasses?: Readonly<Record<HolderKind, HolderClass>>;
}): Result<GaugeReport> {
  const tolerance = input.tolerance ?? DEFAULT_CLOSURE_TOLERANCE;
  const classes = input.holderClasses ?? DEFAULT_HOLDER_CLASSES;
  const issues = [...validateLedger(input.holders, input.moves), ...validateTolerance(tolerance)];
  const byId = new Map(input.holders.map((h) => [h.id, h]));
  input.readings.forEach((r, i) => {
    const h = byId.get(r.holderId);
    if (h === undefined) {
      issues.push({
        code: "MASS_BALANCE.UNKNOWN_HOLDER",
        message: `Gauge reading ${i + 1}: holder ${r.holderId} is not in the list`,
        field: `readings.${i}.holderId`,
      });
    } else if (classes[h.kind] !== "STOCK") {
      issues.push({
        code: "MASS_BALANCE.GAUGE_NOT_STOCK",
        message: `Gauge reading ${i + 1}: a ${h.kind} holds no stock to gauge`,
        field: `readings.${i}.holderId`,
      });
    }
    if (!Number.isSafeInteger(r.massG) || r.massG < 0) {
      issues.push({
        code: "MASS_BALANCE.INVALID_MASS",
        message: `Gauge reading ${i + 1}: measured mass must be whole grams, 0 or more`,
        field: `readings.${i}.massG`,
      });
    }
    if (!Number.isSafeInteger(r.at)) {
      issues.push({
        code: "MASS_BALANCE.INVALID_TIME",
        message: `Gauge reading ${i + 1}: time must be an instant in milliseconds`,
        field: `readings.${i}.at`,
      });
    }
  });
  if (issues.length > 0) return failMany(issues);

  const rows: GaugeComparison[] = input.readings.map((r) => {
    const bookG = stockBefore(input.moves, r.at, true).get(r.holderId) ?? 0;
    const differenceG = r.massG - bookG;
    return {
      holderId: r.holderId,
      at: r.at,
      bookG,
      measuredG: r.massG,
      differenceG,
      closure: classifyClosure(differenceG, bookG, tolerance),
    };
  });
  const latest = new Map<number, GaugeComparison>();
  for (const row of rows) {
    const prev = latest.get(row.holderId);
    if (prev === undefined || row.at >= prev.at) latest.set(row.holderId, row);
  }
  let bookG = 0;
  let measuredG = 0;
  for (const row of latest.values()) {
    bookG += row.bookG;
    measuredG += row.measuredG;
  }
  return ok({
    rows,
    total: {
      bookG,
      measuredG,
      differenceG: measuredG - bookG,
      closure: classifyClosure(measuredG - bookG, bookG, tolerance),
    },
    tolerance,
  });
}
