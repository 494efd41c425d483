// The default density table: per material its density at 15 °C, its slope in temperature, and the source
// of each number with its status (sourced, from memory, common practice).
import type { DensityTable } from "@/lib/quantity/density-entry";

const VEG_OIL_SLOPE = -0.64;
const VEG_OIL_SLOPE_SOURCE =
  "slope −0.64 kg/m³/K: JAOCS 76:1415–1419 (1999), linear 24–110 °C, citing Noureddini, Teoh & Clements 1992 (JAOCS 69)";
const UCO_NOTE = "no published standard density; measure each lot and override";

// ρ15 values derived from 20 °C / 40 °C relative densities: ρ = d × ρ_water(20 °C) (998.2067 kg/m³,
// Tanaka 2001), then shifted to 15 °C with the vegetable-oil slope.
export const DEFAULT_DENSITY_TABLE: DensityTable = {
  USED_COOKING_OIL: {
    model: "linear",
    densityAt15KgM3: 918.2,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "from memory",
    source: `ρ: ≈0.91–0.92 g/cm³ at 20 °C (from memory, unverified), midpoint 915 + 5 K × 0.64; ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
    note: UCO_NOTE,
  },
  YELLOW_GREASE: {
    model: "linear",
    densityAt15KgM3: 918.2,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "from memory",
    source: `placeholder: same as used cooking oil (rendered UCO); ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
    note: UCO_NOTE,
  },
  TRAP_GREASE: {
    model: "linear",
    densityAt15KgM3: 918.2,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "from memory",
    source: `placeholder: same as used cooking oil; no sourced value for trap/brown grease; ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
    note: "contains water and solids; density varies widely — measure each lot and override",
  },
  TALLOW: {
    model: "linear",
    densityAt15KgM3: 912.9,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "common practice",
    source:
      "ρ: relative density 0.893–0.904 at 40 °C / water 20 °C, Bockisch, Fats and Oils Handbook (1998); midpoint 0.8985 × 998.2067 + 25 K × 0.64; slope: vegetable-oil value applied to animal fat (common practice)",
    validRangeC: { minC: 40, maxC: 110 },
    note: "ρ15 is a liquid-phase extrapolation; tallow is solid at 15 °C — measure it molten",
  },
  SOYBEAN: {
    model: "linear",
    densityAt15KgM3: 923.5,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "sourced",
    source: `ρ: relative density 0.919–0.925 at 20 °C / water 20 °C, Codex CXS 210-1999; midpoint 0.922 × 998.2067 + 5 K × 0.64; ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
  },
  CANOLA: {
    model: "linear",
    densityAt15KgM3: 918.6,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "sourced",
    source: `ρ: relative density 0.914–0.920 at 20 °C, Codex CXS 210-1999 (rapeseed, low erucic); midpoint 0.917 × 998.2067 + 5 K × 0.64; ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
  },
  OTHER_OIL: {
    model: "linear",
    densityAt15KgM3: 920.0,
    slopeKgM3PerK: VEG_OIL_SLOPE,
    status: "common practice",
    source: `placeholder for an unlisted vegetable oil (≈0.92 g/cm³, common practice); ${VEG_OIL_SLOPE_SOURCE}`,
    validRangeC: { minC: 24, maxC: 110 },
    ambientNoteFromC: 15,
    note: "override with the supplier's or the lab's density",
  },
  FAME: {
    model: "linear",
    densityAt15KgM3: 880.0,
    slopeKgM3PerK: -0.7,
    status: "from memory",
    source:
      "ρ15: typical 880 kg/m³ (EN 14214 Table 1 range 860–900 at 15 °C; NREL handling guide value via corrosionpedia); slope ≈0.70 kg/m³/K from ASTM D1250 fuel-oil constants K0 = 186.9696, K1 = 0.4862 (from memory, unverified); Tat & Van Gerpen 2000 (JAOCS 77:115) found biodiesel density linear in T",
    validRangeC: { minC: 0, maxC: 80 },
  },
  METHANOL: {
    model: "linear",
    densityAt15KgM3: 796.0,
    slopeKgM3PerK: -0.94,
    status: "sourced",
    source: "Merck Index: d(15/4) 0.7960, d(20/4) 0.7915, d(25/4) 0.7866 g/cm³; slope (0.7866 − 0.7960)/10 K",
    validRangeC: { minC: 0, maxC: 25 },
  },
  GLYCEROL: {
    model: "linear",
    densityAt15KgM3: 1263.82,
    slopeKgM3PerK: -0.612,
    status: "from memory",
    source:
      "ρ = 1273 − 0.612·t(°C) kg/m³, fit attributed to Volk & Kähler 2018 (Exp. Fluids 59:75) (from memory, unverified); ≈1260 kg/m³ at room temperature [sourced, same paper]",
    note: "pure glycerol; crude glycerol from a plant contains methanol, water and soap and is lighter",
  },
  WATER: {
    model: "water-tanaka-2001",
    status: "sourced",
    source:
      "Tanaka et al. 2001, Metrologia 38:301 (CIPM formula for air-free SMOW); constants from memory, checked against the paper's tabulated 999.1026 (15 °C) and 998.2067 (20 °C) kg/m³",
    validRangeC: { minC: 0, maxC: 40 },
  },
};
