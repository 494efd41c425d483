// Hazard flags of a waste container under a rule set: ignitability (D001) and corrosivity (D002) from its
// characterisation, and listed codes. Unknown is never non-hazardous.
import type { WasteStream } from "@/lib/core/vocabulary";
import type { PHYSICAL_STATES } from "@/lib/waste/waste.schema";
import type { WasteRuleSet } from "@/lib/waste/rule-set";
import { RULESET_US_FEDERAL_RCRA } from "@/lib/waste/rule-set";

export type PhysicalState = (typeof PHYSICAL_STATES)[number];

export interface WasteCharacterisation {
  /** Alcohol content, % by volume. */
  methanolPct?: number | null;
  pH?: number | null;
  /** Closed-cup flash point, °C. */
  flashPointC?: number | null;
  /** Water content, % by weight. */
  waterPct?: number | null;
  /** Explicit determination; overrides the water content. */
  aqueous?: boolean | null;
  /** Defaults by stream when absent (see DEFAULT_PHYSICAL_STATE). */
  physicalState?: PhysicalState | null;
  /** For non-liquids, the generator's determination under 40 CFR 261.21(a)(2). */
  solidIgnitable?: boolean | null;
  listedCodes?: readonly string[];
}

export const DEFAULT_PHYSICAL_STATE: Readonly<Record<WasteStream, PhysicalState | null>> = {
  GLYCEROL_PHASE: "LIQUID",
  WASH_WATER: "LIQUID",
  METHANOL_RICH: "LIQUID",
  FILTER_MEDIA: "SOLID",
  OTHER: null,
};

export type HazardStatus = "YES" | "NO" | "UNKNOWN";

export interface HazardFlag {
  code: "D001" | "D002";
  status: HazardStatus;
  reason: string;
  source: string;
  /** Characterisation fields that would settle an UNKNOWN. */
  missing: string[];
}

export type HazardOverall = "HAZARDOUS" | "NEEDS_CHARACTERISATION" | "NON_HAZARDOUS";

export interface HazardAssessment {
  ignitable: HazardFlag;
  corrosive: HazardFlag;
  listedCodes: string[];
  /** Unknown is never non-hazardous: it is NEEDS_CHARACTERISATION and is handled as hazardous for due dates. */
  overall: HazardOverall;
}

function present(v: number | null | undefined): v is number {
  return v !== null && v !== undefined;
}

/** 40 CFR 261.21(a)(2) is taken as the generator's own determination for non-liquids. */
function assessSolidIgnitability(c: WasteCharacterisation): HazardFlag {
  const source = "40 CFR 261.21(a)(2)";
  if (c.solidIgnitable === true)
    return {
      code: "D001",
      status: "YES",
      reason: "Non-liquid determined ignitable under 40 CFR 261.21(a)(2)",
      source,
      missing: [],
    };
  if (c.solidIgnitable === false)
    return {
      code: "D001",
      status: "NO",
      reason: "Non-liquid determined not ignitable under 40 CFR 261.21(a)(2)",
      source,
      missing: [],
    };
  return {
    code: "D001",
    status: "UNKNOWN",
    reason: "Non-liquid: needs a determination under 40 CFR 261.21(a)(2)",
    source,
    missing: ["solidIgnitable"],
  };
}

/** 40 CFR 261.21(a)(1): a liquid below the flash-point limit, unless an aqueous solution under the alcohol limit. */
function assessLiquidIgnitability(c: WasteCharacterisation, rules: WasteRuleSet): HazardFlag {
  const source = rules.ignitableFlashPointBelowC.source;
  const aqueous = c.aqueous ?? (present(c.waterPct) ? c.waterPct >= rules.aqueousMinWaterPctMass.value : null);
  const alcohol = present(c.methanolPct) ? c.methanolPct : null;
  const alcoholLimit = rules.ignitableAqueousAlcoholBelowPctVol.value;
  if (aqueous === true && alcohol !== null && alcohol < alcoholLimit) {
    return {
      code: "D001",
      status: "NO",
      reason: `Aqueous solution with ${alcohol} % alcohol by volume, below ${alcoholLimit} %: excluded`,
      source,
      missing: [],
    };
  }
  const exclusionMissing =
    aqueous === null ? ["aqueous or waterPct"] : aqueous === true && alcohol === null ? ["methanolPct"] : [];
  if (!present(c.flashPointC)) {
    return {
      code: "D001",
      status: "UNKNOWN",
      reason: "Liquid without a closed-cup flash point",
      source,
      missing: ["flashPointC", ...exclusionMissing],
    };
  }
  const limit = rules.ignitableFlashPointBelowC.value;
  if (c.flashPointC < limit) {
    const why =
      exclusionMissing.length > 0
        ? `; the aqueous < ${alcoholLimit} % alcohol exclusion was not established`
        : aqueous === true
          ? `; alcohol ${alcohol} % is not below ${alcoholLimit} %`
          : "";
    return {
      code: "D001",
      status: "YES",
      reason: `Liquid with flash point ${c.flashPointC} °C, below ${limit} °C${why}`,
      source,
      missing: exclusionMissing,
    };
  }
  return {
    code: "D001",
    status: "NO",
    reason: `Flash point ${c.flashPointC} °C is not below ${limit} °C`,
    source,
    missing: [],
  };
}

/** 40 CFR 261.21(a)(1) for liquids; (a)(2) is taken as the generator's own determination for non-liquids. */
function assessIgnitability(c: WasteCharacterisation, state: PhysicalState | null, rules: WasteRuleSet): HazardFlag {
  if (state === null) {
    return {
      code: "D001",
      status: "UNKNOWN",
      reason: "Physical state not recorded: liquid or solid decides which ignitability test applies",
      source: rules.ignitableFlashPointBelowC.source,
      missing: ["physicalState"],
    };
  }
  return state === "SOLID" ? assessSolidIgnitability(c) : assessLiquidIgnitability(c, rules);
}

/** 40 CFR 261.22(a)(1): aqueous waste with pH ≤ 2 or ≥ 12.5. The steel-corrosion test of (a)(2) is not assessed. */
function assessCorrosivity(c: WasteCharacterisation, state: PhysicalState | null, rules: WasteRuleSet): HazardFlag {
  const source = rules.corrosivePhAtLeast.source;
  if (state === "SOLID") {
    return {
      code: "D002",
      status: "NO",
      reason: "Non-liquid: the pH test of 40 CFR 261.22(a)(1) applies to aqueous wastes",
      source,
      missing: [],
    };
  }
  if (c.aqueous === false) {
    return {
      code: "D002",
      status: "NO",
      reason:
        "Determined not aqueous: the pH test does not apply; the steel-corrosion test of 261.22(a)(2) is not assessed here",
      source,
      missing: [],
    };
  }
  if (!present(c.pH)) return { code: "D002", status: "UNKNOWN", reason: "No pH measured", source, missing: ["pH"] };
  const low = rules.corrosivePhAtMost.value;
  const high = rules.corrosivePhAtLeast.value;
  if (c.pH <= low)
    return { code: "D002", status: "YES", reason: `pH ${c.pH} is at or below ${low}`, source, missing: [] };
  if (c.pH >= high)
    return { code: "D002", status: "YES", reason: `pH ${c.pH} is at or above ${high}`, source, missing: [] };
  return { code: "D002", status: "NO", reason: `pH ${c.pH} is between ${low} and ${high}`, source, missing: [] };
}

export function assessWasteHazards(
  stream: WasteStream,
  characterisation: WasteCharacterisation | null,
  rules: WasteRuleSet = RULESET_US_FEDERAL_RCRA,
): HazardAssessment {
  const c = characterisation ?? {};
  const state = c.physicalState ?? DEFAULT_PHYSICAL_STATE[stream];
  const ignitable = assessIgnitability(c, state, rules);
  const corrosive = assessCorrosivity(c, state, rules);
  const listedCodes = [...(c.listedCodes ?? [])];
  const overall: HazardOverall =
    listedCodes.length > 0 || ignitable.status === "YES" || corrosive.status === "YES"
      ? "HAZARDOUS"
      : ignitable.status === "UNKNOWN" || corrosive.status === "UNKNOWN"
        ? "NEEDS_CHARACTERISATION"
        : "NON_HAZARDOUS";
  return { ignitable, corrosive, listedCodes, overall };
}
