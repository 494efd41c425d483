// What each grid table shows: columns per record type, which can be typed on new rows, which are
// computed on the server (read-only), and how a column maps to the stored field for sort and filter.
import {
  BATCH_STATUSES,
  CATALYSTS,
  LOT_STATUSES,
  MATERIAL_KINDS,
  PRODUCT_STATUSES,
  SOURCE_KINDS,
  WASTE_STREAMS,
} from "@/lib/core/vocabulary";
import { LOOKS } from "@/lib/feedstock/pickup.schema";
import { FFA_BASES, TITRANTS } from "@/lib/titration/titration";
import type { Quantity } from "@/lib/grid/units";

export type CellKind = "code" | "text" | "number" | "integer" | "date" | "enum" | "list" | "boolean";
export type CellValue = string | number | boolean | null;
export type GridRow = Record<string, CellValue>;

export interface GridColumn {
  field: string;
  header: string;
  kind: CellKind;
  /** Rows carry kg, L or °C; the grid shows and accepts the user's units. */
  quantity?: Quantity;
  /** A unit that never converts (g, mL, mol/L, %), shown in the header. */
  fixedUnit?: string;
  options?: readonly string[];
  /** Part of the input typed on a new row (the shared schema's field of the same name). */
  entry?: boolean;
  /** Computed on the server after each save; never typed. */
  computed?: boolean;
  /** On an existing row this field can be changed through a service that records the change. */
  correctable?: readonly string[];
  /** Stored field for server-side sort and filter; `scale` = stored / shown (kg → g is 1000). */
  db?: { path: string; scale?: number };
  decimals?: number;
  width?: number;
}

export const TABLE_KEYS = [
  "sources",
  "pickups",
  "lots",
  "titrations",
  "labTests",
  "batches",
  "batchFlows",
  "products",
  "qcResults",
  "shipments",
  "wasteContainers",
  "disposals",
] as const;
export type TableKey = (typeof TABLE_KEYS)[number];

export interface GridTable {
  key: TableKey;
  label: string;
  /** Field that identifies a row on screen and in the URL of its page. */
  rowId: string;
  /** Fields that identify a row across imports: a re-imported row with these values is the same record. */
  importKey: readonly string[];
  /** Who may add rows by typing, pasting or importing; empty when rows are made elsewhere. */
  addRoles: readonly ("COLLECTOR" | "PRODUCTION" | "COMPLIANCE")[];
  columns: readonly GridColumn[];
  totals: { mass?: string; volume?: string };
  /** Plain-language note shown above the grid. */
  note: string;
  defaultSort: { field: string; dir: "asc" | "desc" };
}

const code = (field: string, header: string, path = field, entry = true): GridColumn => ({
  field,
  header,
  kind: "code",
  entry,
  db: { path },
  width: 130,
});
const text = (field: string, header: string, entry = true, width = 180): GridColumn => ({
  field,
  header,
  kind: "text",
  entry,
  db: { path: field },
  width,
});
const date = (field: string, header: string, entry = true, path = field): GridColumn => ({
  field,
  header,
  kind: "date",
  entry,
  db: { path },
  width: 165,
});
const oneOf = (field: string, header: string, options: readonly string[], entry = true, path = field): GridColumn => ({
  field,
  header,
  kind: "enum",
  options,
  entry,
  db: { path },
  width: 150,
});
const kg = (field: string, header: string, path: string, computed = true): GridColumn => ({
  field,
  header,
  kind: "number",
  quantity: "mass",
  computed,
  db: { path, scale: 1000 },
  width: 130,
});
const litres = (
  field: string,
  header: string,
  path: string,
  o: { entry?: boolean; computed?: boolean; scale?: number } = {},
): GridColumn => ({
  field,
  header,
  kind: "number",
  quantity: "volume",
  entry: o.entry ?? false,
  computed: o.computed ?? false,
  db: { path, scale: o.scale ?? 1000 },
  width: 130,
});
const celsius = (field: string, header: string, entry = true, path = field): GridColumn => ({
  field,
  header,
  kind: "number",
  quantity: "temperature",
  entry,
  db: { path },
  width: 110,
});
const num = (
  field: string,
  header: string,
  fixedUnit: string | undefined,
  o: { entry?: boolean; computed?: boolean; decimals?: number; integer?: boolean } = {},
): GridColumn => ({
  field,
  header,
  kind: o.integer ? "integer" : "number",
  ...(fixedUnit ? { fixedUnit } : {}),
  entry: o.entry ?? true,
  computed: o.computed ?? false,
  db: { path: field },
  decimals: o.decimals ?? 3,
  width: 120,
});
const flag = (field: string, header: string, entry = true): GridColumn => ({
  field,
  header,
  kind: "boolean",
  entry,
  db: { path: field },
  width: 100,
});
const ro = (c: GridColumn): GridColumn => ({ ...c, entry: false });
/** Derived on the server from other rows: shown, not sorted or filtered by the database. */
const derived = (c: GridColumn): GridColumn => {
  const { db: _db, ...rest } = c;
  return { ...rest, entry: false };
};

export const GRID_TABLES: Readonly<Record<TableKey, GridTable>> = {
  sources: {
    key: "sources",
    label: "Sources",
    rowId: "code",
    importKey: ["code"],
    addRoles: ["PRODUCTION"],
    note: "Suppliers and collection points. New sources can be typed, pasted or imported; stored sources are changed on their own page.",
    defaultSort: { field: "code", dir: "asc" },
    totals: {},
    columns: [
      code("code", "Code"),
      text("name", "Name"),
      oneOf("kind", "Kind", SOURCE_KINDS),
      {
        field: "materials",
        header: "Materials",
        kind: "list",
        options: MATERIAL_KINDS,
        entry: true,
        db: { path: "materials" },
        width: 200,
      },
      text("address", "Address", true, 200),
      text("certificateNo", "Certificate no.", true, 140),
      text("certificateScheme", "Certificate scheme", true, 150),
      date("certificateExpires", "Certificate expires"),
      num("pickupEveryDays", "Pickup every", "days", { integer: true, decimals: 0 }),
      text("collectorNote", "Note for the collector", true, 200),
      ro(flag("active", "Active", false)),
    ],
  },
  pickups: {
    key: "pickups",
    label: "Pickups",
    rowId: "code",
    importKey: ["code"],
    addRoles: ["COLLECTOR", "PRODUCTION"],
    note: "Oil collected at sources. Mass is computed on the server from volume and temperature. Booked quantities are not edited in place: a mistake is reversed with a correcting entry.",
    defaultSort: { field: "observedAt", dir: "desc" },
    totals: { mass: "massKg", volume: "volumeL" },
    columns: [
      code("code", "Pickup no."),
      code("sourceCode", "Source", "source.code"),
      oneOf("material", "Material", MATERIAL_KINDS),
      date("observedAt", "Observed"),
      num("containers", "Containers", undefined, { integer: true, decimals: 0 }),
      {
        field: "containerTags",
        header: "Container labels",
        kind: "list",
        entry: true,
        db: { path: "containerTags" },
        width: 160,
      },
      litres("volumeL", "Volume", "volumeMl", { entry: true }),
      celsius("tempC", "Oil temp."),
      kg("massKg", "Mass", "massG"),
      oneOf("waterLook", "Water (look)", LOOKS),
      oneOf("solidsLook", "Solids (look)", LOOKS),
      text("notes", "Notes"),
      ro(code("lotCode", "In lot", "lot.code", false)),
      ro(date("receivedAt", "Received", false)),
    ],
  },
  lots: {
    key: "lots",
    label: "Feedstock lots",
    rowId: "code",
    importKey: ["code"],
    addRoles: ["PRODUCTION"],
    note: "A new lot is either a supplier delivery (give supplier and document) or pooled pickups (give pickup numbers, comma-separated). Standard volume, mass, stock and FFA are computed. Only the lab decision of a lot awaiting lab can be changed here.",
    defaultSort: { field: "receivedAt", dir: "desc" },
    totals: { mass: "massKg", volume: "standardVolumeL" },
    columns: [
      code("code", "Lot no."),
      oneOf("material", "Material", MATERIAL_KINDS),
      ro(oneOf("origin", "Origin", ["PICKUPS", "DELIVERY"], false)),
      code("supplierCode", "Supplier", "supplier.code"),
      text("deliveryDocument", "Delivery document", true, 150),
      { field: "pickupCodes", header: "Pickups", kind: "list", entry: true, width: 160 },
      date("receivedAt", "Received"),
      litres("observedVolumeL", "Observed volume", "observedVolumeMl", { entry: true }),
      celsius("observedTempC", "Observed temp."),
      num("densityKgM3", "Density at 15 °C", "kg/m³", { decimals: 1 }),
      litres("standardVolumeL", "Standard volume", "standardVolumeMl", { computed: true }),
      kg("massKg", "Mass", "massG"),
      kg("stockKg", "In stock", "holder.stockG"),
      {
        field: "ffaPct",
        header: "FFA (latest)",
        kind: "number",
        fixedUnit: "%",
        computed: true,
        decimals: 2,
        width: 110,
      },
      { ...oneOf("status", "Status", LOT_STATUSES, false), correctable: ["ACCEPTED", "REJECTED"] },
      flag("certified", "Certified"),
      text("notes", "Notes"),
    ],
  },
  titrations: {
    key: "titrations",
    label: "Titrations",
    rowId: "id",
    importKey: ["lotCode", "testedAt", "sampleMassG", "titreMl"],
    addRoles: ["PRODUCTION"],
    note: "FFA titrations per lot. FFA % and acid value are computed on the server (AOCS Ca 5a-40). The titration alcohol (isopropanol) is flammable and the hydroxide titrant corrosive: follow the safety data sheets and the lab's procedures.",
    defaultSort: { field: "testedAt", dir: "desc" },
    totals: {},
    columns: [
      ro(num("id", "No.", undefined, { entry: false, integer: true, decimals: 0 })),
      code("lotCode", "Lot no.", "lot.code"),
      date("testedAt", "Tested"),
      num("sampleMassG", "Sample", "g"),
      oneOf("titrant", "Titrant", TITRANTS),
      num("concentrationMolL", "Concentration", "mol/L", { decimals: 4 }),
      num("titreMl", "Titre", "mL", { decimals: 2 }),
      num("blankMl", "Blank", "mL", { decimals: 2 }),
      oneOf("basis", "Basis", FFA_BASES),
      num("ffaPct", "FFA", "%", { entry: false, computed: true, decimals: 2 }),
      num("acidValue", "Acid value", "mg KOH/g", { entry: false, computed: true, decimals: 2 }),
      ro(text("analyst", "Analyst", false, 140)),
      ro(flag("voided", "Voided", false)),
    ],
  },
  labTests: {
    key: "labTests",
    label: "Lab results",
    rowId: "id",
    importKey: ["lotCode", "testedAt", "kind"],
    addRoles: ["PRODUCTION"],
    note: "Water, insolubles and unsaponifiables per lot.",
    defaultSort: { field: "testedAt", dir: "desc" },
    totals: {},
    columns: [
      ro(num("id", "No.", undefined, { entry: false, integer: true, decimals: 0 })),
      code("lotCode", "Lot no.", "lot.code"),
      date("testedAt", "Tested"),
      oneOf("kind", "Test", ["WATER", "INSOLUBLES", "UNSAPONIFIABLES"]),
      text("method", "Method", true, 140),
      num("valuePct", "Result", "%", { decimals: 3 }),
      ro(text("analyst", "Analyst", false, 140)),
      ro(flag("voided", "Voided", false)),
    ],
  },
  batches: {
    key: "batches",
    label: "Batches",
    rowId: "code",
    importKey: ["code"],
    addRoles: [],
    note: "Batches are planned, started and finished on their own pages; their draws and outputs are in “Batch inputs and outputs”.",
    defaultSort: { field: "plannedAt", dir: "desc" },
    totals: { mass: "targetOilKg" },
    columns: [
      ro(code("code", "Batch no.")),
      ro(oneOf("status", "Status", BATCH_STATUSES)),
      ro(flag("pretreated", "Pretreated")),
      ro(date("plannedAt", "Planned")),
      ro(date("startedAt", "Started")),
      ro(date("completedAt", "Finished")),
      { ...kg("targetOilKg", "Target oil", "targetOilG", false), entry: false },
      ro(num("molarRatio", "Methanol : oil", "mol/mol", { entry: false, decimals: 1 })),
      ro(oneOf("catalyst", "Catalyst", CATALYSTS)),
      ro(celsius("reactionTempC", "Reaction temp.")),
      kg("stockKg", "In batch now", "holder.stockG"),
      ro(text("notes", "Notes")),
    ],
  },
  batchFlows: {
    key: "batchFlows",
    label: "Batch inputs and outputs",
    rowId: "id",
    importKey: ["id"],
    addRoles: [],
    note: "Every draw into a batch (oil, methanol, catalyst, acid) and every output (ester, glycerol phase, wash water, recovered methanol, recorded losses, and the unmeasured difference booked when the batch finished) from the ledger. Ledger rows are never edited; a mistake is reversed by a new row.",
    defaultSort: { field: "at", dir: "desc" },
    totals: { mass: "massKg", volume: "volumeL" },
    columns: [
      ro(num("id", "Entry no.", undefined, { entry: false, integer: true, decimals: 0 })),
      derived(code("batchCode", "Batch no.")),
      derived(oneOf("direction", "Direction", ["IN", "OUT"])),
      ro(
        oneOf("role", "What", [
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
          "UNMEASURED",
          "TRANSFER",
        ]),
      ),
      derived(code("otherCode", "From / to")),
      ro(date("at", "When")),
      { ...kg("massKg", "Mass", "massG", false), entry: false },
      litres("volumeL", "Volume", "volumeMl"),
      ro(celsius("tempC", "Temp.")),
      ro(text("note", "Note")),
    ],
  },
  products: {
    key: "products",
    label: "Product lots",
    rowId: "code",
    importKey: ["code"],
    addRoles: [],
    note: "Product lots are made when a batch is finished; release and rejection happen on the lot's page.",
    defaultSort: { field: "producedAt", dir: "desc" },
    totals: { mass: "massKg" },
    columns: [
      ro(code("code", "Product lot")),
      ro(code("batchCode", "Batch no.", "batch.code")),
      ro(date("producedAt", "Produced")),
      kg("massKg", "Mass", "massG"),
      kg("stockKg", "In stock", "holder.stockG"),
      ro(oneOf("status", "Status", PRODUCT_STATUSES)),
      ro(date("releasedAt", "Released")),
    ],
  },
  qcResults: {
    key: "qcResults",
    label: "Product QC results",
    rowId: "id",
    importKey: ["id"],
    addRoles: [],
    note: "Quality results per product lot against its specification limits.",
    defaultSort: { field: "testedAt", dir: "desc" },
    totals: {},
    columns: [
      ro(num("id", "No.", undefined, { entry: false, integer: true, decimals: 0 })),
      ro(code("productCode", "Product lot", "productLot.code")),
      ro(text("property", "Property", false, 150)),
      ro(text("method", "Method", false, 140)),
      ro(num("value", "Result", undefined, { entry: false, decimals: 4 })),
      ro(text("unit", "Unit", false, 90)),
      ro(num("limitMin", "Min", undefined, { entry: false, decimals: 4 })),
      ro(num("limitMax", "Max", undefined, { entry: false, decimals: 4 })),
      ro(text("specRef", "Specification", false, 140)),
      ro(flag("pass", "Pass", false)),
      ro(date("testedAt", "Tested")),
    ],
  },
  shipments: {
    key: "shipments",
    label: "Shipments",
    rowId: "documentNo",
    importKey: ["documentNo"],
    addRoles: [],
    note: "Product shipped to customers.",
    defaultSort: { field: "shippedAt", dir: "desc" },
    totals: { mass: "massKg", volume: "volumeL" },
    columns: [
      ro(code("documentNo", "Document no.")),
      ro(text("customer", "Customer")),
      ro(date("shippedAt", "Shipped")),
      { ...kg("massKg", "Mass", "massG", false), entry: false },
      litres("volumeL", "Volume", "volumeMl"),
      ro(flag("certifiedClaim", "Certified claim", false)),
    ],
  },
  wasteContainers: {
    key: "wasteContainers",
    label: "Waste containers",
    rowId: "code",
    importKey: ["code"],
    addRoles: [],
    note: "Glycerol phase, wash water and other waste on site. Days until the haul is due are computed on the server under the site's assumed generator category; local rules may be stricter.",
    defaultSort: { field: "accumulationStart", dir: "desc" },
    totals: { mass: "stockKg" },
    columns: [
      ro(code("code", "Container")),
      ro(oneOf("stream", "Stream", WASTE_STREAMS)),
      ro(date("accumulationStart", "Accumulation start")),
      litres("capacityL", "Capacity", "capacityMl"),
      ro(flag("satellite", "Satellite area")),
      ro(num("methanolPct", "Methanol", "%", { entry: false, decimals: 1 })),
      ro(num("pH", "pH", undefined, { entry: false, decimals: 1 })),
      ro(celsius("flashPointC", "Flash point")),
      ro(num("waterPct", "Water", "%", { entry: false, decimals: 1 })),
      ro(oneOf("status", "Status", ["OPEN", "FULL", "SHIPPED"])),
      kg("stockKg", "Held", "holder.stockG"),
      {
        field: "daysUntilDue",
        header: "Days until haul due",
        kind: "integer",
        computed: true,
        decimals: 0,
        width: 150,
      },
    ],
  },
  disposals: {
    key: "disposals",
    label: "Waste disposals",
    rowId: "documentNo",
    importKey: ["documentNo"],
    addRoles: [],
    note: "Waste hauled away, by manifest or shipping document.",
    defaultSort: { field: "disposedAt", dir: "desc" },
    totals: { mass: "massKg" },
    columns: [
      ro(code("documentNo", "Document no.")),
      ro(text("hauler", "Hauler")),
      ro(date("disposedAt", "Collected")),
      { ...kg("massKg", "Mass", "massG", false), entry: false },
    ],
  },
};

export function isTableKey(s: string): s is TableKey {
  return (TABLE_KEYS as readonly string[]).includes(s);
}

export function columnOf(table: GridTable, field: string): GridColumn | undefined {
  return table.columns.find((c) => c.field === field);
}

/** Columns a person can type into on a new row. */
export function entryColumns(table: GridTable): GridColumn[] {
  return table.columns.filter((c) => c.entry === true && c.computed !== true);
}
