// What may be done with a waste container in its present state: pure checks the container service
// runs inside its transaction (the ledger's guarded draw still has the last word on quantities).
import type { DomainIssue } from "@/lib/core/result";
import type { WasteStream } from "@/lib/core/vocabulary";
import type { WasteCharacterisation } from "@/lib/waste/waste-due";

export type ContainerStatus = "OPEN" | "FULL" | "SHIPPED";

function kgText(grams: number): string {
  return `${(grams / 1000).toLocaleString("en", { maximumFractionDigits: 3 })} kg`;
}

/** A container is marked full once, while it is still on site. */
export function checkMarkFull(
  c: { code: string; status: string; accumulationStart: Date },
  fullAt: Date,
): DomainIssue | null {
  if (c.status === "SHIPPED")
    return {
      code: "WASTE.ALREADY_HAULED",
      message: `Container ${c.code} has already been hauled away`,
      field: "containerCode",
    };
  if (c.status === "FULL")
    return {
      code: "WASTE.ALREADY_FULL",
      message: `Container ${c.code} is already marked full`,
      field: "containerCode",
    };
  if (fullAt < c.accumulationStart)
    return { code: "WASTE.BEFORE_START", message: "Full on is before the container started filling", field: "fullAt" };
  return null;
}

/**
 * A haul-away takes from what the container holds on the books, on or after the day it started filling,
 * and never from a container that has already left. `stockG` is the book stock now.
 */
export function checkHaul(
  c: { code: string; status: string; accumulationStart: Date; stockG: number },
  haul: { massG: number; disposedAt: Date },
): DomainIssue | null {
  if (c.status === "SHIPPED")
    return {
      code: "WASTE.ALREADY_HAULED",
      message: `Container ${c.code} has already been hauled away`,
      field: "containerCode",
    };
  if (haul.disposedAt < c.accumulationStart)
    return {
      code: "WASTE.BEFORE_START",
      message: "Collected time is before the container started filling",
      field: "disposedAt",
    };
  if (haul.massG > c.stockG) {
    return {
      code: "LEDGER.OVERDRAW",
      message: `Container ${c.code} holds ${kgText(c.stockG)}; a haul of ${kgText(haul.massG)} is more than it holds`,
      field: "massKg",
    };
  }
  return null;
}

/** A characterisation may be recorded while the container is on site, dated on or after its start. */
export function checkCharacterise(
  c: { code: string; status: string; accumulationStart: Date },
  testedAt: Date,
): DomainIssue | null {
  if (c.status === "SHIPPED")
    return {
      code: "WASTE.ALREADY_HAULED",
      message: `Container ${c.code} has already been hauled away`,
      field: "containerCode",
    };
  if (testedAt < c.accumulationStart)
    return {
      code: "WASTE.BEFORE_START",
      message: "Test date is before the container started filling",
      field: "testedAt",
    };
  return null;
}

/** The stored measurements as the hazard assessment reads them (a value not measured stays null). */
export function characterisationOf(c: {
  methanolPct: number | null;
  pH: number | null;
  flashPointC: number | null;
  waterPct: number | null;
}): WasteCharacterisation {
  return { methanolPct: c.methanolPct, pH: c.pH, flashPointC: c.flashPointC, waterPct: c.waterPct };
}

/**
 * The usual cautions for handling a stream (common practice). The kit's Cautions adds the closing line
 * that the safety data sheets, the site's procedures and local codes govern.
 */
export const STREAM_CAUTIONS: Readonly<Record<WasteStream, readonly string[]>> = {
  GLYCEROL_PHASE: [
    "The glycerol phase carries methanol and is flammable: no ignition sources, hot work or smoking nearby.",
    "Transfer only with the drum, tote or tanker bonded and grounded; keep the container closed and ventilated.",
  ],
  METHANOL_RICH: [
    "Methanol-rich liquid is highly flammable and toxic: no ignition sources, hot work or smoking nearby.",
    "Transfer only with the containers bonded and grounded; keep it closed, wear chemical-resistant gloves and eye protection.",
  ],
  FILTER_MEDIA: [
    "Spent filter media that is oily or wet with methanol is flammable and can heat itself and catch fire.",
    "Keep it in closed metal bins, away from buildings and other combustibles, until it is hauled away.",
  ],
  WASH_WATER: [
    "Wash water may carry methanol, soap and catalyst residue and is often alkaline: wear eye protection and chemical-resistant gloves.",
    "Keep it out of drains unless the discharge permit allows it.",
  ],
  OTHER: ["Find out what the container holds before moving it; treat it as hazardous until it is characterised."],
};
