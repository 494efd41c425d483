// ASTM D6751-23a, Standard Specification for Biodiesel Fuel Blend Stock (B100) for Middle Distillate Fuels.
// Every row names its source and edition. Rows marked confidence "check" could not be read in the
// current edition's text and must be confirmed against the purchased standard before being relied on.
import type { EditionTable } from "@/lib/spec/spec.schema";

const T1 = "ASTM D6751-23a Table 1";
const S15 = ["no-1-b-s15", "no-1-b-s15-lm", "no-2-b-s15", "no-2-b-s15-lm"];
const S500 = ["no-1-b-s500", "no-2-b-s500"];
const ONE_B = ["no-1-b-s15", "no-1-b-s15-lm", "no-1-b-s500"];
const TWO_B = ["no-2-b-s15", "no-2-b-s15-lm", "no-2-b-s500"];
const LOW_METALS = ["no-1-b-s15-lm", "no-2-b-s15-lm"];

export const ASTM_D6751_23A: EditionTable = {
  key: "astm-d6751-23a",
  title: "Biodiesel fuel blend stock (B100) for middle distillate fuels",
  edition: "ASTM D6751-23a",
  grades: [
    { key: "no-1-b-s15", grade: "No. 1-B S15" },
    { key: "no-1-b-s15-lm", grade: "No. 1-B S15 LM" },
    { key: "no-1-b-s500", grade: "No. 1-B S500" },
    { key: "no-2-b-s15", grade: "No. 2-B S15" },
    // Grade taken to exist by symmetry with No. 1-B S15 LM — confirm against the purchased standard.
    { key: "no-2-b-s15-lm", grade: "No. 2-B S15 LM", note: "Confirm this grade in the purchased standard." },
    { key: "no-2-b-s500", grade: "No. 2-B S500" },
  ],
  rows: [
    { key: "calcium-magnesium", label: "Calcium and magnesium, combined", method: "EN 14538", unit: "ppm (µg/g)", kind: "limit", max: 5, required: true, confidence: "published", source: T1 },
    { key: "sodium-potassium", label: "Sodium and potassium, combined", method: "EN 14538", unit: "ppm (µg/g)", kind: "limit", max: 5, required: true, confidence: "published", source: T1 },
    // ASTM D6751-23a scope: low-metals grades hold Na + K + Ca + Mg to 4 ppm combined.
    { key: "metals-combined", label: "Sodium, potassium, calcium and magnesium, combined", method: "Sum of the EN 14538 results", unit: "ppm (µg/g)", kind: "limit", max: 4, required: true, confidence: "published", source: "ASTM D6751-23a (low-metals grades)", grades: LOW_METALS },
    { key: "flash-point", label: "Flash point (closed cup)", method: "ASTM D93", unit: "°C", kind: "limit", min: 93, required: true, confidence: "published", source: T1 },
    // Alcohol control, first alternative; the either-or rule below decides it with the flash point.
    { key: "methanol", label: "Methanol content", method: "EN 14110", unit: "% mass", kind: "limit", max: 0.2, decimals: 1, required: false, confidence: "published", note: "Alcohol control: either this or a flash point of at least 130 °C.", source: T1 },
    { key: "water-sediment", label: "Water and sediment", method: "ASTM D2709", unit: "% volume", kind: "limit", max: 0.05, decimals: 3, required: true, confidence: "published", source: T1 },
    { key: "viscosity-40c", label: "Kinematic viscosity, 40 °C", method: "ASTM D445", unit: "mm²/s", kind: "limit", min: 1.9, max: 6.0, decimals: 1, required: true, confidence: "published", source: T1 },
    { key: "sulfated-ash", label: "Sulfated ash", method: "ASTM D874", unit: "% mass", kind: "limit", max: 0.02, decimals: 3, required: true, confidence: "published", source: T1 },
    // ASTM D6751-23a Table 1: 0.0015 % mass (15 ppm) for S15 grades, 0.05 % mass (500 ppm) for S500 grades.
    { key: "sulfur", label: "Sulfur", method: "ASTM D5453", unit: "ppm (µg/g)", kind: "limit", max: 15, required: true, confidence: "published", note: "0.0015 % mass", source: T1, grades: S15 },
    { key: "sulfur", label: "Sulfur", method: "ASTM D5453", unit: "ppm (µg/g)", kind: "limit", max: 500, required: true, confidence: "published", note: "0.05 % mass", source: T1, grades: S500 },
    { key: "copper-strip", label: "Copper strip corrosion (3 h, 50 °C)", method: "ASTM D130", unit: "", kind: "class", classMax: 3, classScale: "No.", required: true, confidence: "published", source: T1 },
    { key: "cetane-number", label: "Cetane number", method: "ASTM D613", unit: "", kind: "limit", min: 47, required: true, confidence: "published", source: T1 },
    { key: "cloud-point", label: "Cloud point", method: "ASTM D2500", unit: "°C", kind: "report", required: true, confidence: "published", note: "Reported to the customer.", source: T1 },
    { key: "carbon-residue", label: "Carbon residue (100 % sample)", method: "ASTM D4530", unit: "% mass", kind: "limit", max: 0.05, decimals: 3, required: true, confidence: "published", source: T1 },
    { key: "acid-number", label: "Acid number", method: "ASTM D664", unit: "mg KOH/g", kind: "limit", max: 0.5, decimals: 2, required: true, confidence: "published", source: T1 },
    { key: "free-glycerin", label: "Free glycerin", method: "ASTM D6584", unit: "% mass", kind: "limit", max: 0.02, decimals: 3, required: true, confidence: "published", source: T1 },
    { key: "total-glycerin", label: "Total glycerin", method: "ASTM D6584", unit: "% mass", kind: "limit", max: 0.24, decimals: 3, required: true, confidence: "published", source: T1 },
    // from memory — confirm against the purchased standard (No. 1-B 0.40 % mass max; No. 2-B report).
    { key: "monoglycerides", label: "Monoglyceride content", method: "ASTM D6584", unit: "% mass", kind: "limit", max: 0.4, decimals: 2, required: true, confidence: "check", source: T1, grades: ONE_B },
    // from memory — confirm against the purchased standard.
    { key: "monoglycerides", label: "Monoglyceride content", method: "ASTM D6584", unit: "% mass", kind: "report", required: true, confidence: "check", source: T1, grades: TWO_B },
    { key: "phosphorus", label: "Phosphorus content", method: "ASTM D4951", unit: "% mass", kind: "limit", max: 0.001, decimals: 3, required: true, confidence: "published", source: T1 },
    { key: "distillation-t90", label: "Distillation temperature, 90 % recovered (atmospheric equivalent)", method: "ASTM D1160", unit: "°C", kind: "limit", max: 360, required: true, confidence: "published", source: T1 },
    // Seen only in an older edition / a testing laboratory's summary — confirm against the purchased standard.
    { key: "oxidation-stability", label: "Oxidation stability, 110 °C", method: "EN 15751", unit: "h", kind: "limit", min: 3, decimals: 1, required: true, confidence: "check", source: T1 },
    // Limits seen in older editions; the grade mapping is from memory — confirm against the purchased standard.
    { key: "cold-soak", label: "Cold soak filterability", method: "ASTM D7501", unit: "s", kind: "limit", max: 200, required: true, confidence: "check", source: T1, grades: ONE_B },
    // Limits seen in older editions; the grade mapping is from memory — confirm against the purchased standard.
    { key: "cold-soak", label: "Cold soak filterability", method: "ASTM D7501", unit: "s", kind: "limit", max: 360, required: true, confidence: "check", source: T1, grades: TWO_B },
  ],
  rules: [
    // ASTM D6751-23a Table 1, alcohol control: methanol ≤ 0.2 % mass OR flash point ≥ 130 °C.
    { key: "alcohol-control", label: "Alcohol control", anyOf: [{ property: "methanol", max: 0.2 }, { property: "flash-point", min: 130 }], source: T1 },
  ],
};
