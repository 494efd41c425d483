// The shapes of the trace answers (backward and forward reports, their tables and stage graph) and the
// stages a holder is drawn in. Shared by the trace services, the pages, the CSV and the API.
import type { BackwardKind, ForwardKind } from "@/lib/trace/trace-query.schema";
import { labelOf } from "@/lib/core/vocabulary";
import type { HolderKind } from "@/lib/core/vocabulary";
import type { HolderRef } from "@/lib/ledger/holder-ref";
import type { CustomerShare, ShipmentCustomer } from "@/lib/trace/customers";

/**
 * CERTIFIED: the lot is marked certified and its source held a certificate valid when the material
 * entered; LOT_ONLY / SOURCE_ONLY: only one of the two; NOT_FEEDSTOCK: reagents and other entries.
 */
export type CertificationStatus = "CERTIFIED" | "LOT_ONLY" | "SOURCE_ONLY" | "NOT_CERTIFIED" | "NOT_FEEDSTOCK";

export const CERTIFICATION_LABELS: Readonly<Record<CertificationStatus, string>> = {
  CERTIFIED: "Certified lot and valid source certificate",
  LOT_ONLY: "Lot marked certified, source without a valid certificate",
  SOURCE_ONLY: "Source certified, lot not marked certified",
  NOT_CERTIFIED: "Not certified",
  NOT_FEEDSTOCK: "Reagent or other (not feedstock)",
};

export interface ContributionRow {
  /** A lot, pickup or source code, a material kind or a certification status. */
  key: string;
  label: string;
  materialKind: string | null;
  /** Pickup and certification rows: the origin's status. */
  certification: CertificationStatus | null;
  /** Lot rows: whether the lot is marked certified. */
  lotCertified: boolean | null;
  /** Source and pickup rows: e.g. "Regional sustainable-waste scheme SC-QM-1003, valid to 2027-02-10". */
  certificate: string | null;
  lotCode: string | null;
  sourceCode: string | null;
  grams: number;
  /** Of the table's total; the grams, not the percents, add up exactly. */
  pct: number;
  origins: number;
}

export interface ContributionTables {
  totalG: number;
  byLot: ContributionRow[];
  byPickup: ContributionRow[];
  bySource: ContributionRow[];
  byMaterial: ContributionRow[];
  byCertification: ContributionRow[];
}

export interface OriginRow {
  /** The movement that booked the material in. */
  originId: number;
  enteredAt: Date;
  entryHolder: HolderRef | null;
  pickupCode: string | null;
  lotCode: string | null;
  sourceCode: string | null;
  sourceName: string | null;
  materialKind: string | null;
  certification: CertificationStatus;
  certificate: string | null;
  grams: number;
  pct: number;
}

export type GraphNodeKind = HolderKind | "SOURCE" | "OTHERS" | "ENTRY";

export interface GraphNode {
  id: string;
  stage: number;
  kind: GraphNodeKind;
  code: string;
  label: string;
  grams: number;
  /** Holders folded into an "others" box. */
  folded: number;
  target: boolean;
}

export interface GraphEdge {
  from: string;
  to: string;
  grams: number;
}

export interface TraceGraph {
  stages: string[];
  nodes: GraphNode[];
  edges: GraphEdge[];
  totalG: number;
  /** Boxes below this share of the total are folded into one "others" box per stage. */
  foldBelowPct: number;
  /** Upstream paths carrying fewer grams than this are not followed further. */
  pruneBelowG: number;
  note: string;
}

export interface LedgerFreshness {
  movements: number;
  lastMoveId: number | null;
  reversedPairsLeftOut: number;
  /** When this server process indexed this ledger version. */
  indexedAt: Date;
  indexMs: number;
  snapshots: number;
  latestSnapshotAt: Date | null;
  order: "dated" | "booked";
  orderProblem: string | null;
  /** Server time for this answer, including the ledger-version check. */
  computeMs: number;
  /** The answer was already computed for this ledger version. */
  fromCache: boolean;
}

export interface BackwardTraceReport {
  query: { kind: BackwardKind; code: string; at: Date | null };
  target: HolderRef;
  /** RECEIVED: everything that went into the holder; STOCK: what a tank held at the time. */
  basis: "RECEIVED" | "STOCK";
  asOf: { moveId: number; at: Date } | null;
  totalG: number;
  all: ContributionTables;
  /** Feedstock only, renormalised over the feedstock grams; reagents are listed separately. */
  feedstock: ContributionTables;
  reagentsG: number;
  /** % of the whole traced quantity. */
  reagents: ContributionRow[];
  /** Material that entered at holders that are neither feedstock nor reagent lots. */
  otherG: number;
  origins: OriginRow[];
  graph: TraceGraph | null;
  freshness: LedgerFreshness;
}

export interface ForwardHolderRow {
  holder: HolderRef;
  stage: number;
  stageLabel: string;
  /** Grams of the traced material that moved into the holder. */
  receivedG: number;
  /** Grams of it the holder still holds (for shipments, disposals and losses: what left the books there). */
  heldG: number;
  firstAt: Date | null;
  /** For a shipment: the customer it went to. */
  customer?: ShipmentCustomer;
}

export interface ForwardTraceReport {
  query: { kind: ForwardKind; code: string };
  subject: { kind: ForwardKind; code: string; label: string };
  origins: number;
  enteredG: number;
  asOf: { moveId: number; at: Date } | null;
  holders: ForwardHolderRow[];
  /** Where the material is now, by stage; adds up to enteredG. */
  heldByStage: Array<{ stage: number; label: string; grams: number; holders: number }>;
  /** Traced grams shipped, per customer (largest first). */
  byCustomer: CustomerShare[];
  movesCarried: number;
  graph: TraceGraph | null;
  freshness: LedgerFreshness;
}

// ---- stages --------------------------------------------------------------------------------------

export const STAGES = [
  "Source",
  "Pickup",
  "Lot or reagent",
  "Feedstock or methanol tank",
  "Batch",
  "Product lot",
  "Product tank",
  "Left the books",
  "Waste container",
] as const;

export function stageOf(ref: HolderRef, tankService: ReadonlyMap<number, string>): number {
  switch (ref.kind) {
    case "PICKUP":
      return 1;
    case "DELIVERY":
    case "LOT":
    case "REAGENT_LOT":
      return 2;
    case "TANK":
      return tankService.get(ref.id) === "PRODUCT" ? 6 : 3;
    case "BATCH":
      return 4;
    case "PRODUCT_LOT":
      return 5;
    case "SHIPMENT":
    case "DISPOSAL":
    case "LOSS":
    case "DIFFERENCE":
      return 7;
    case "WASTE_CONTAINER":
      return 8;
  }
}

const LEFT_BOOKS_LABEL: Partial<Record<HolderKind, string>> = {
  SHIPMENT: "Shipped",
  DISPOSAL: "Hauled away as waste",
  LOSS: "Recorded losses",
  DIFFERENCE: "Unmeasured batch differences",
};

export function stageLabelOf(ref: HolderRef, stage: number): string {
  return (stage === 7 ? LEFT_BOOKS_LABEL[ref.kind] : undefined) ?? STAGES[stage] ?? labelOf(ref.kind);
}
