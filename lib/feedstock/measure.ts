// Observed volume and temperature → mass and standard volume, with the density basis kept for the record.
import type { Result } from "@/lib/core/result";
import { failMany, ok } from "@/lib/core/result";
import type { DensityTable } from "@/lib/quantity/density";
import {
  applyMeasuredDensity,
  densityAt,
  massFromObserved,
  requireDensityEntry,
  standardVolume,
} from "@/lib/quantity/density";
import type { MaterialKind } from "@/lib/core/vocabulary";

export interface Measured {
  massG: number;
  standardVolumeMl: number;
  densityKgM3: number; // at the reference temperature
  referenceTempC: number;
  densitySource: string;
}

export function measureObserved(input: {
  material: MaterialKind;
  observedVolumeL: number;
  observedTempC: number;
  measuredDensityKgM3?: number | undefined;
  referenceTempC: number;
  table: DensityTable;
}): Result<Measured> {
  const base = requireDensityEntry(input.table, input.material);
  const entry =
    input.measuredDensityKgM3 === undefined
      ? base
      : applyMeasuredDensity(base, {
          densityKgM3: input.measuredDensityKgM3,
          atTempC: 15,
          source: "lab density at 15 °C",
        });
  const mass = massFromObserved({ observedVolumeL: input.observedVolumeL, observedTempC: input.observedTempC, entry });
  const std = standardVolume({
    observedVolumeL: input.observedVolumeL,
    observedTempC: input.observedTempC,
    entry,
    referenceTempC: input.referenceTempC,
  });
  if (!mass.ok || !std.ok) return failMany([...(mass.ok ? [] : mass.issues), ...(std.ok ? [] : std.issues)]);
  return ok({
    massG: mass.value.massG,
    standardVolumeMl: std.value.standardVolumeMl,
    densityKgM3: densityAt(entry, input.referenceTempC),
    referenceTempC: input.referenceTempC,
    densitySource: input.measuredDensityKgM3 === undefined ? `table: ${base.source}` : entry.source,
  });
}
