// A shipment line's quantity in the books' units, and a shipment's totals. Pure.
import type { DomainIssue, Result } from "@/lib/core/result";
import { failMany, ok } from "@/lib/core/result";
import type { DensityEntry } from "@/lib/quantity/density";
import {
  DEFAULT_REFERENCE_TEMP_C,
  massFromObserved,
  observedVolumeFromMass,
  standardVolume,
} from "@/lib/quantity/density";
import { toGrams, toMillilitres } from "@/lib/quantity/units";

export interface LineQuantityInput {
  massKg?: number | undefined;
  volumeL?: number | undefined;
  tempC?: number | undefined;
}

export interface LineQuantity {
  massG: number;
  /** Litres at 15 °C, or the volume as stated when a mass and a volume were both given. */
  volumeMl: number;
  /** The loading temperature when a volume was typed with one. */
  tempC: number | null;
  /** How the mass was found, for the record: "weighed" or "from volume". */
  basis: "MASS" | "VOLUME";
}

function issue(field: string, message: string): DomainIssue {
  return { code: "QUANTITY.INVALID", message, field };
}

/**
 * A mass is taken as given (its volume at 15 °C from the fuel's density unless a volume was also
 * stated); a volume at a temperature becomes a mass through the density at that temperature and a
 * volume at 15 °C through the same density model (lib/quantity/density.ts).
 */
export function lineQuantity(line: LineQuantityInput, entry: DensityEntry): Result<LineQuantity> {
  if (line.massKg !== undefined) {
    const massG = toGrams(line.massKg);
    if (line.volumeL !== undefined)
      return ok({ massG, volumeMl: toMillilitres(line.volumeL), tempC: line.tempC ?? null, basis: "MASS" });
    const v = observedVolumeFromMass({ massKg: line.massKg, observedTempC: DEFAULT_REFERENCE_TEMP_C, entry });
    if (!v.ok) return failMany(v.issues.map((i) => issue("massKg", i.message)));
    return ok({ massG, volumeMl: v.value.volumeMl, tempC: null, basis: "MASS" });
  }
  if (line.volumeL === undefined)
    return failMany([issue("massKg", "Quantity is required (kg, or litres with the temperature)")]);
  if (line.tempC === undefined)
    return failMany([issue("tempC", "Temperature (°C) is needed to turn litres into kilograms")]);
  const m = massFromObserved({ observedVolumeL: line.volumeL, observedTempC: line.tempC, entry });
  const s = standardVolume({
    observedVolumeL: line.volumeL,
    observedTempC: line.tempC,
    entry,
    referenceTempC: DEFAULT_REFERENCE_TEMP_C,
  });
  if (!m.ok) return failMany(m.issues.map((i) => issue("tempC", i.message)));
  if (!s.ok) return failMany(s.issues.map((i) => issue("tempC", i.message)));
  if (m.value.massG <= 0) return failMany([issue("volumeL", "Quantity is too small to book (under 1 g)")]);
  return ok({ massG: m.value.massG, volumeMl: s.value.standardVolumeMl, tempC: line.tempC, basis: "VOLUME" });
}

/** The shipment's mass and volume: the sums of its lines (integer grams and millilitres, exact). */
export function shipmentTotals(lines: ReadonlyArray<{ massG: number; volumeMl: number }>): {
  massG: number;
  volumeMl: number;
} {
  let massG = 0;
  let volumeMl = 0;
  for (const l of lines) {
    massG += l.massG;
    volumeMl += l.volumeMl;
  }
  return { massG, volumeMl };
}
