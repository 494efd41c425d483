// The trade's vocabulary as closed lists. Stored as strings (SQLite has no enums); the zod schemas
// built from these lists are the only gate into the database.

export const SITE_ROLES = ["COLLECTOR", "PRODUCTION", "COMPLIANCE", "ADMIN"] as const;
export type SiteRole = (typeof SITE_ROLES)[number];

export const SOURCE_KINDS = ["RESTAURANT", "FOOD_PROCESSOR", "RENDERER", "CRUSHER", "DROP_OFF", "OTHER"] as const;
export type SourceKind = (typeof SOURCE_KINDS)[number];

export const MATERIAL_KINDS = [
  "USED_COOKING_OIL",
  "YELLOW_GREASE",
  "TRAP_GREASE",
  "TALLOW",
  "SOYBEAN",
  "CANOLA",
  "OTHER_OIL",
] as const;
export type MaterialKind = (typeof MATERIAL_KINDS)[number];

export const LOT_STATUSES = ["QUARANTINED", "ACCEPTED", "REJECTED", "CONSUMED"] as const;
export type LotStatus = (typeof LOT_STATUSES)[number];

export const TANK_SERVICES = ["FEEDSTOCK", "PRODUCT", "GLYCEROL_PHASE", "WASH_WATER", "METHANOL"] as const;
export type TankService = (typeof TANK_SERVICES)[number];

export const MIXING_MODELS = ["MIXED", "FIFO"] as const;
export type MixingModel = (typeof MIXING_MODELS)[number];

export const REAGENTS = ["METHANOL", "NAOH", "KOH", "NAOME_SOLUTION", "KOME_SOLUTION", "H2SO4", "WATER"] as const;
export type Reagent = (typeof REAGENTS)[number];

export const CATALYSTS = ["NAOH", "KOH", "NAOME_SOLUTION", "KOME_SOLUTION"] as const;
export type Catalyst = (typeof CATALYSTS)[number];

export const BATCH_STATUSES = ["PLANNED", "RUNNING", "COMPLETE", "VOID"] as const;
export type BatchStatus = (typeof BATCH_STATUSES)[number];

export const PRODUCT_STATUSES = ["HELD", "RELEASED", "REJECTED"] as const;
export type ProductStatus = (typeof PRODUCT_STATUSES)[number];

export const WASTE_STREAMS = ["GLYCEROL_PHASE", "WASH_WATER", "FILTER_MEDIA", "METHANOL_RICH", "OTHER"] as const;
export type WasteStream = (typeof WASTE_STREAMS)[number];

export const WASTE_STATUSES = ["OPEN", "FULL", "SHIPPED"] as const;
export type WasteStatus = (typeof WASTE_STATUSES)[number];

export const HOLDER_KINDS = [
  "PICKUP",
  "DELIVERY",
  "LOT",
  "TANK",
  "BATCH",
  "PRODUCT_LOT",
  "SHIPMENT",
  "WASTE_CONTAINER",
  "DISPOSAL",
  "REAGENT_LOT",
  "LOSS",
  "DIFFERENCE",
] as const;
export type HolderKind = (typeof HOLDER_KINDS)[number];

/**
 * Where material leaves the books: no service draws from these (shipments, disposals, recorded losses,
 * and the site's account of unmeasured batch differences).
 */
export const TERMINAL_KINDS: ReadonlySet<HolderKind> = new Set<HolderKind>([
  "SHIPMENT",
  "DISPOSAL",
  "LOSS",
  "DIFFERENCE",
]);

/** What a movement is, seen from the process. */
export const MOVE_ROLES = [
  "RECEIPT",
  "TRANSFER",
  "OIL",
  "METHANOL",
  "CATALYST",
  "ACID",
  "WATER",
  "ESTER",
  "GLYCEROL_PHASE",
  "WASH_WATER",
  "RECOVERED_METHANOL",
  "LOSS",
  "SHIPMENT",
  "DISPOSAL",
  "UNMEASURED",
] as const;
export type MoveRole = (typeof MOVE_ROLES)[number];

export const BATCH_INPUT_ROLES = [
  "OIL",
  "METHANOL",
  "CATALYST",
  "ACID",
  "WATER",
] as const satisfies readonly MoveRole[];
/** What a worker weighs or gauges out of a batch, plus recorded losses (a spill with its reason). */
export const BATCH_OUTPUT_ROLES = [
  "ESTER",
  "GLYCEROL_PHASE",
  "WASH_WATER",
  "RECOVERED_METHANOL",
  "LOSS",
] as const satisfies readonly MoveRole[];
/**
 * The batch's unmeasured difference: charged minus everything measured out, booked by the service when
 * the batch finishes (out to the site's DIFFERENCE holder, or in from outside the books when more was
 * measured out than charged). Never typed.
 */
export const UNMEASURED_ROLE = "UNMEASURED" as const satisfies MoveRole;

export const PERIOD_STATUSES = ["OPEN", "CLOSED"] as const;

/** Our own plain-language labels, shown in tables and forms. */
export const LABELS: Record<string, string> = {
  COLLECTOR: "Collector",
  PRODUCTION: "Production",
  COMPLIANCE: "Compliance",
  ADMIN: "Administrator",
  RESTAURANT: "Restaurant",
  FOOD_PROCESSOR: "Food processor",
  RENDERER: "Renderer",
  CRUSHER: "Oilseed crusher",
  DROP_OFF: "Drop-off bank",
  OTHER: "Other",
  USED_COOKING_OIL: "Used cooking oil",
  YELLOW_GREASE: "Yellow grease",
  TRAP_GREASE: "Trap grease",
  TALLOW: "Tallow",
  SOYBEAN: "Soybean oil",
  CANOLA: "Canola oil",
  OTHER_OIL: "Other oil",
  QUARANTINED: "Awaiting lab",
  ACCEPTED: "Accepted",
  REJECTED: "Rejected",
  CONSUMED: "Used up",
  FEEDSTOCK: "Feedstock",
  PRODUCT: "Product",
  GLYCEROL_PHASE: "Glycerol phase",
  WASH_WATER: "Wash water",
  METHANOL: "Methanol",
  MIXED: "Mixed",
  FIFO: "First in, first out",
  NAOH: "Sodium hydroxide",
  KOH: "Potassium hydroxide",
  NAOME_SOLUTION: "Sodium methoxide solution",
  KOME_SOLUTION: "Potassium methoxide solution",
  H2SO4: "Sulfuric acid",
  WATER: "Water",
  PLANNED: "Planned",
  RUNNING: "Reacting",
  COMPLETE: "Finished",
  VOID: "Voided",
  HELD: "On hold",
  RELEASED: "Released",
  PASS: "Pass",
  FAIL: "Fail",
  REPORTED: "Reported",
  NOT_JUDGED: "Not judged",
  MISSING: "Missing",
  SUPERSEDED: "Superseded",
  FILTER_MEDIA: "Spent filter media",
  METHANOL_RICH: "Methanol-rich liquid",
  OPEN: "Filling",
  FULL: "Full, awaiting haul",
  SHIPPED: "Hauled away",
  PICKUP: "Pickup",
  DELIVERY: "Delivery",
  LOT: "Feedstock lot",
  TANK: "Tank",
  BATCH: "Batch",
  PRODUCT_LOT: "Product lot",
  SHIPMENT: "Shipment",
  WASTE_CONTAINER: "Waste container",
  DISPOSAL: "Disposal",
  REAGENT_LOT: "Reagent lot",
  LOSS: "Recorded loss",
  DIFFERENCE: "Unmeasured differences",
  UNMEASURED: "Unmeasured difference",
  RECEIPT: "Received",
  TRANSFER: "Transfer",
  OIL: "Oil charged",
  CATALYST: "Catalyst",
  ACID: "Acid",
  ESTER: "Ester out",
  RECOVERED_METHANOL: "Methanol recovered",
  HAZARDOUS: "Hazardous",
  NEEDS_CHARACTERISATION: "Needs characterisation",
  NON_HAZARDOUS: "Not hazardous",
  // Tank gauges: how the volume was found.
  VOLUME: "Volume read directly",
  LEVEL: "Level through the calibration table",
  ACTIVE_CUSTOMER: "Active",
  INACTIVE_CUSTOMER: "No longer supplied",
  // Source checks: a flag's state, and a source's standing after a confirmed flag.
  FLAG_OPEN: "To review",
  FLAG_CONFIRMED: "Confirmed",
  FLAG_DISMISSED: "Dismissed",
  FLAG_CLEARED: "Cleared",
  ON_WATCH: "On watch",
  CREDIT_WITHHELD: "Certified credit withheld",
  FRYERS: "Fryers × litres × changes a week",
  MONTHLY: "Declared litres a month",
};

export function labelOf(code: string): string {
  return LABELS[code] ?? code;
}

/** Distance bands the collect page stores, nearest first, and how far each is. */
export const DISTANCE_BANDS = ["NEAR", "KM_1", "KM_10", "FAR"] as const;
export type DistanceBand = (typeof DISTANCE_BANDS)[number];
export const DISTANCE_BAND_WORDS: Record<DistanceBand, string> = {
  NEAR: "within 250 m",
  KM_1: "250 m to 1 km",
  KM_10: "1 to 10 km",
  FAR: "more than 10 km",
};
