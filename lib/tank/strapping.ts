import { fail, ok } from "@/lib/core/result";
import type { DomainIssue, Result } from "@/lib/core/result";
import { applyMeasuredDensity, massFromObserved } from "@/lib/quantity/density";
import type { DensityEntry, MassFromVolume } from "@/lib/quantity/density";

/**
 * A tank's calibration (strapping) table: pairs [level in mm, volume in L], levels strictly ascending,
 * volumes not decreasing. Between two rows the volume is read by straight-line interpolation, the usual
 * way a calibration table is read between its entries (common practice; API MPMS Chapter 2 covers how
 * such tables are made, not this reading rule). Outside the table nothing is guessed.
 */
export type StrappingTable = ReadonlyArray<readonly [levelMm: number, volumeL: number]>;

/** Problems with a table as typed or stored; empty when it can be used. */
export function strappingProblems(rows: ReadonlyArray<readonly number[]>): string[] {
  const problems: string[] = [];
  if (rows.length < 2) problems.push("a calibration table needs at least two rows");
  rows.forEach((r, i) => {
    if (r.length !== 2 || !r.every((v) => Number.isFinite(v) && v >= 0)) {
      problems.push(`row ${i + 1} must be two numbers, level (mm) and volume (L), neither negative`);
      return;
    }
    const prev = rows[i - 1];
    if (prev === undefined || prev.length !== 2) return;
    if (!(r[0]! > prev[0]!)) problems.push(`row ${i + 1}: levels must rise from row to row`);
    if (r[1]! < prev[1]!) problems.push(`row ${i + 1}: volume must not fall as the level rises`);
  });
  return problems;
}

/** The stored JSON ("" when none) as a table; null when the tank has none or the stored text is unusable. */
export function parseStrapping(json: string): StrappingTable | null {
  if (json.trim() === "") return null;
  let raw: unknown;
  try {
    raw = JSON.parse(json);
  } catch {
    return null;
  }
  if (
    !Array.isArray(raw) ||
    !raw.every((r): r is number[] => Array.isArray(r) && r.every((v) => typeof v === "number"))
  )
    return null;
  if (strappingProblems(raw).length > 0) return null;
  return raw.map((r) => [r[0]!, r[1]!] as const);
}

/** Volume (L) at a level (mm) by linear interpolation between the table's rows; refused outside the table. */
export function volumeAtLevel(table: StrappingTable, levelMm: number, field = "levelMm"): Result<number> {
  if (!Number.isFinite(levelMm)) return fail("TANK.LEVEL_NOT_A_NUMBER", "Level (mm) must be a number", field);
  const first = table[0];
  const last = table[table.length - 1];
  if (first === undefined || last === undefined)
    return fail("TANK.NO_CALIBRATION", "This tank has no calibration table; enter the volume read directly", field);
  if (levelMm < first[0] || levelMm > last[0]) {
    return fail(
      "TANK.LEVEL_OUTSIDE_TABLE",
      `Level must be between ${first[0]} and ${last[0]} mm, the range of the tank's calibration table`,
      field,
    );
  }
  for (let i = 1; i < table.length; i++) {
    const lo = table[i - 1]!;
    const hi = table[i]!;
    if (levelMm <= hi[0]) {
      const share = (levelMm - lo[0]) / (hi[0] - lo[0]);
      return ok(lo[1] + share * (hi[1] - lo[1]));
    }
  }
  return ok(last[1]);
}

export interface VolumeToMass extends MassFromVolume {
  /** Density at the reference temperature the conversion started from, kg/m³. */
  referenceDensityKgM3: number;
  referenceTempC: number;
}

/**
 * Mass of a volume observed at a temperature, from a density known at a reference temperature (a lot's
 * measured or table density at 15 °C), keeping the material's temperature slope from the density table:
 * m = V_obs · ρ(t_obs), ρ(t) = ρ_ref + s·(t − t_ref) (the linear model of lib/quantity/density.ts).
 */
export function massOfVolume(o: {
  volumeL: number;
  tempC: number;
  entry: DensityEntry;
  densityKgM3?: number;
  referenceTempC?: number;
  field?: string;
}): Result<VolumeToMass> {
  const referenceTempC = o.referenceTempC ?? 15;
  const entry =
    o.densityKgM3 === undefined
      ? o.entry
      : applyMeasuredDensity(o.entry, {
          densityKgM3: o.densityKgM3,
          atTempC: referenceTempC,
          source: "lot or sample density",
        });
  const r = massFromObserved({ observedVolumeL: o.volumeL, observedTempC: o.tempC, entry });
  if (!r.ok) return { ok: false, issues: r.issues.map((i): DomainIssue => ({ ...i, field: o.field ?? "volumeL" })) };
  const referenceDensityKgM3 =
    entry.model === "linear"
      ? entry.densityAt15KgM3 + entry.slopeKgM3PerK * (referenceTempC - 15)
      : r.value.densityKgM3;
  return ok({ ...r.value, referenceDensityKgM3, referenceTempC });
}

export interface GaugeVsBook {
  differenceG: number;
  /** (gauge − book) ÷ book × 100; null when the book stock is zero. */
  differencePct: number | null;
}

/** Gauge minus book, in grams and as a share of the book stock. */
export function gaugeVsBook(gaugeG: number, bookG: number): GaugeVsBook {
  const differenceG = gaugeG - bookG;
  return { differenceG, differencePct: bookG === 0 ? null : (differenceG * 100) / bookG };
}
