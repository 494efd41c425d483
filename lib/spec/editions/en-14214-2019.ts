// EN 14214:2012+A2:2019, Liquid petroleum products — Fatty acid methyl esters (FAME) for use in diesel
// engines and heating applications. Every row names its source and edition. The cold-flow properties
// depend on the climate class the site supplies to; they are reported here and a site sets its class
// limit in a site specification.
import type { EditionTable } from "@/lib/spec/spec.schema";

const T = "EN 14214:2012+A2:2019 Table 1";
const CLIMATE = "EN 14214:2012+A2:2019 climate-dependent requirements";

export const EN_14214_2019: EditionTable = {
  key: "en-14214-2019",
  title: "Fatty acid methyl esters (FAME) for diesel engines",
  edition: "EN 14214:2012+A2:2019",
  grades: [{ key: "fame", grade: "FAME for diesel engines" }],
  rows: [
    { key: "ester-content", label: "FAME (ester) content", method: "EN 14103", unit: "% (m/m)", kind: "limit", min: 96.5, decimals: 1, required: true, confidence: "published", source: T },
    { key: "density-15c", label: "Density at 15 °C", method: "EN ISO 3675 / EN ISO 12185", unit: "kg/m³", kind: "limit", min: 860, max: 900, required: true, confidence: "published", source: T },
    { key: "viscosity-40c", label: "Kinematic viscosity at 40 °C", method: "EN ISO 3104", unit: "mm²/s", kind: "limit", min: 3.5, max: 5.0, decimals: 2, required: true, confidence: "published", source: T },
    { key: "flash-point", label: "Flash point", method: "EN ISO 2719 / EN ISO 3679", unit: "°C", kind: "limit", min: 101, required: true, confidence: "published", source: T },
    { key: "cetane-number", label: "Cetane number", method: "EN ISO 5165", unit: "", kind: "limit", min: 51, decimals: 1, required: true, confidence: "published", source: T },
    { key: "copper-strip", label: "Copper strip corrosion (3 h, 50 °C)", method: "EN ISO 2160", unit: "", kind: "class", classMax: 1, classScale: "Class", required: true, confidence: "published", source: T },
    { key: "oxidation-stability", label: "Oxidation stability, 110 °C", method: "EN 14112 / EN 15751", unit: "h", kind: "limit", min: 8, decimals: 1, required: true, confidence: "published", source: T },
    { key: "acid-value", label: "Acid value", method: "EN 14104", unit: "mg KOH/g", kind: "limit", max: 0.5, decimals: 2, required: true, confidence: "published", source: T },
    { key: "iodine-value", label: "Iodine value", method: "EN 14111 / EN 16300", unit: "g iodine/100 g", kind: "limit", max: 120, required: true, confidence: "published", source: T },
    { key: "linolenic-ester", label: "Linolenic acid methyl ester", method: "EN 14103", unit: "% (m/m)", kind: "limit", max: 12, decimals: 1, required: true, confidence: "published", source: T },
    { key: "polyunsaturated-esters", label: "Polyunsaturated (≥ 4 double bonds) methyl esters", method: "EN 15779", unit: "% (m/m)", kind: "limit", max: 1, decimals: 2, required: true, confidence: "published", source: T },
    { key: "methanol", label: "Methanol content", method: "EN 14110", unit: "% (m/m)", kind: "limit", max: 0.2, decimals: 2, required: true, confidence: "published", source: T },
    { key: "monoglycerides", label: "Monoglyceride content", method: "EN 14105", unit: "% (m/m)", kind: "limit", max: 0.7, decimals: 2, required: true, confidence: "published", source: T },
    { key: "diglycerides", label: "Diglyceride content", method: "EN 14105", unit: "% (m/m)", kind: "limit", max: 0.2, decimals: 2, required: true, confidence: "published", source: T },
    { key: "triglycerides", label: "Triglyceride content", method: "EN 14105", unit: "% (m/m)", kind: "limit", max: 0.2, decimals: 2, required: true, confidence: "published", source: T },
    { key: "free-glycerol", label: "Free glycerol", method: "EN 14105 / EN 14106", unit: "% (m/m)", kind: "limit", max: 0.02, decimals: 2, required: true, confidence: "published", source: T },
    { key: "total-glycerol", label: "Total glycerol", method: "EN 14105", unit: "% (m/m)", kind: "limit", max: 0.25, decimals: 2, required: true, confidence: "published", source: T },
    { key: "water", label: "Water content", method: "EN ISO 12937", unit: "mg/kg", kind: "limit", max: 500, required: true, confidence: "published", source: T },
    { key: "total-contamination", label: "Total contamination", method: "EN 12662", unit: "mg/kg", kind: "limit", max: 24, required: true, confidence: "published", source: T },
    { key: "sulfated-ash", label: "Sulfated ash", method: "ISO 3987", unit: "% (m/m)", kind: "limit", max: 0.02, decimals: 2, required: true, confidence: "published", source: T },
    { key: "sulfur", label: "Sulfur", method: "EN ISO 20846 / EN ISO 20884 / EN ISO 13032", unit: "mg/kg", kind: "limit", max: 10, decimals: 1, required: true, confidence: "published", source: T },
    { key: "group-1-metals", label: "Group I metals (Na + K)", method: "EN 14108 / EN 14109 / EN 14538", unit: "mg/kg", kind: "limit", max: 5, decimals: 1, required: true, confidence: "published", source: T },
    { key: "group-2-metals", label: "Group II metals (Ca + Mg)", method: "EN 14538", unit: "mg/kg", kind: "limit", max: 5, decimals: 1, required: true, confidence: "published", source: T },
    { key: "phosphorus", label: "Phosphorus content", method: "EN 14107 / EN 16294", unit: "mg/kg", kind: "limit", max: 4, decimals: 1, required: true, confidence: "published", source: T },
    // The class list (temperate grades A +5 °C … F −20 °C, arctic classes) is from memory — confirm against
    // the purchased standard. Reported here; a site sets its climate class limit in a site specification.
    { key: "cfpp", label: "Cold filter plugging point", method: "EN 116", unit: "°C", kind: "report", required: true, confidence: "check", note: "Limit depends on the climate class supplied to; set it in a site specification.", source: CLIMATE },
    // EN 14214:2012+A2:2019: where CFPP ≤ −20 °C, viscosity at −20 °C ≤ 48 mm²/s; reported here.
    { key: "viscosity-minus-20c", label: "Kinematic viscosity at −20 °C", method: "EN ISO 3104", unit: "mm²/s", kind: "report", required: false, confidence: "published", note: "At most 48 mm²/s where the climate class has a CFPP of −20 °C or lower.", source: CLIMATE },
  ],
  rules: [],
};
