// The phone's pickup form: unit conversion, gauge readings, the pickup number, and the check made
// before an entry is saved to the outbox — the SAME schema the server parses, plus "is this a known source".
import type { DomainIssue, Result } from "@/lib/core/result";
import { failMany, ok } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { PickupSchema } from "@/lib/feedstock/pickup.schema";
import type { Pickup } from "@/lib/feedstock/pickup.schema";
import type { UnitSystem } from "@/lib/quantity/units";
import { convertVolume, fahrenheitToCelsius } from "@/lib/quantity/units";

export const MAX_FILL_PCT = 100;

export function volumeUnit(system: UnitSystem): "L" | "gal" {
  return system === "us" ? "gal" : "L";
}

export function temperatureUnit(system: UnitSystem): "°C" | "°F" {
  return system === "us" ? "°F" : "°C";
}

/** Litres from what the collector typed in their unit; NaN stays NaN so the schema names the field. */
export function litresFrom(value: number, system: UnitSystem): number {
  return system === "us" ? convertVolume(value, "gal", "L") : value;
}

export function celsiusFrom(value: number, system: UnitSystem): number {
  return system === "us" ? fahrenheitToCelsius(value) : value;
}

/**
 * Volume from a gauge reading: each container's nominal size times the fill level read on its gauge or
 * dipstick mark. A fill level outside 0–100 % comes back as NaN so the volume check refuses it.
 */
export function volumeFromGauge(containers: number, containerSizeL: number, fillPct: number): number {
  if (!(fillPct > 0 && fillPct <= MAX_FILL_PCT) || !(containerSizeL > 0) || !Number.isFinite(containers))
    return Number.NaN;
  return Math.round(containers * containerSizeL * (fillPct / 100) * 1000) / 1000;
}

/** "PU-261202-1A2B3C4D": the local date and the first 8 hex digits of the entry's idempotency key. */
export function pickupNumber(localDay: string, key: string): string {
  const hex = key.replace(/-/g, "").slice(0, 8).toUpperCase();
  return `PU-${localDay.replace(/-/g, "").slice(2)}-${hex}`;
}

/**
 * The phone's check before saving: the shared PickupSchema (the server parses the same one), then the
 * source must be one the phone knows for this site. Issues name the field path, as the server's do.
 */
export function checkOnPhone(input: unknown, knownSourceCodes: ReadonlySet<string>): Result<Pickup> {
  const parsed = parseInput(PickupSchema, input);
  const issues: DomainIssue[] = parsed.ok ? [] : [...parsed.issues];
  const sourceCode =
    typeof input === "object" && input !== null && "sourceCode" in input
      ? String(input.sourceCode).trim().toUpperCase()
      : "";
  const sourceNamed = parsed.ok || !issues.some((i) => i.field === "sourceCode");
  if (sourceNamed && sourceCode !== "" && !knownSourceCodes.has(sourceCode))
    issues.push({ code: "RECORD.NOT_FOUND", message: `Source ${sourceCode} does not exist`, field: "sourceCode" });
  if (issues.length) return failMany(issues);
  if (!parsed.ok) return parsed;
  return ok(parsed.value);
}
