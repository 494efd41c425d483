// Book stock against measured tank gauges, flagged as a share of book stock.
import { failMany, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import type { HolderKind } from "@/lib/core/vocabulary";
import {
  DEFAULT_CLOSURE_TOLERANCE,
  DEFAULT_HOLDER_CLASSES,
  classifyClosure,
  validateTolerance,
} from "@/lib/mass-balance/balance-rules";
import type {
  BalanceHolder,
  BalanceMove,
  Closure,
  ClosureTolerance,
  HolderClass,
} from "@/lib/mass-balance/balance-types";
import { stockBefore, validateLedger } from "@/lib/mass-balance/ledger-slots";

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
  /** Book stock of each reading's holder at its time, when `moves` do not reach back that far. */
  bookOf?: (reading: GaugeReading) => number;
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
    const bookG = input.bookOf ? input.bookOf(r) : (stockBefore(input.moves, r.at, true).get(r.holderId) ?? 0);
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
