// CSV downloads of the trace tables: RFC 4180 (CRLF line ends, fields with a comma, quote or line
// break quoted, quotes doubled) and cells that a spreadsheet would run as a formula neutralised.
import { labelOf } from "@/lib/core/vocabulary";
import type {
  BackwardTraceReport,
  ContributionRow,
  ContributionTables,
  ForwardTraceReport,
} from "@/lib/trace/trace.service";

export type CsvCell = string | number | boolean | null;

/** Characters that make a spreadsheet treat a cell as a formula (OWASP "CSV injection"; tab and CR included). */
const FORMULA_START = /^[=+\-@\t\r]/;

export function formatCsvCell(value: CsvCell): string {
  if (value === null) return "";
  let text = typeof value === "string" ? value : typeof value === "boolean" ? (value ? "yes" : "no") : String(value);
  if (typeof value === "string" && FORMULA_START.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function toCsv(rows: ReadonlyArray<ReadonlyArray<CsvCell>>): string {
  return rows.map((r) => r.map(formatCsvCell).join(",")).join("\r\n") + "\r\n";
}

const kg3 = (grams: number) => (grams / 1000).toFixed(3);
const pct4 = (pct: number) => pct.toFixed(4);

export const BACKWARD_TABLES = [
  "sources",
  "lots",
  "pickups",
  "materials",
  "certification",
  "reagents",
  "origins",
] as const;
export type BackwardTable = (typeof BACKWARD_TABLES)[number];

function contributionCsv(
  first: string,
  rows: readonly ContributionRow[],
  totalG: number,
  extra: "lot" | "pickup" | "source" | "plain",
  totalPct = rows.length === 0 ? 0 : 100,
): CsvCell[][] {
  const head: CsvCell[] =
    extra === "lot"
      ? [first, "description", "material", "lot_certified", "origins", "grams", "kg", "percent"]
      : extra === "pickup"
        ? [first, "description", "source", "lot", "material", "certification", "certificate", "grams", "kg", "percent"]
        : extra === "source"
          ? [first, "description", "material", "certificate", "origins", "grams", "kg", "percent"]
          : [first, "description", "origins", "grams", "kg", "percent"];
  const body = rows.map((r): CsvCell[] =>
    extra === "lot"
      ? [r.key, r.label, r.materialKind, r.lotCertified, r.origins, r.grams, kg3(r.grams), pct4(r.pct)]
      : extra === "pickup"
        ? [
            r.key,
            r.label,
            r.sourceCode,
            r.lotCode,
            r.materialKind,
            r.certification,
            r.certificate,
            r.grams,
            kg3(r.grams),
            pct4(r.pct),
          ]
        : extra === "source"
          ? [r.key, r.label, r.materialKind, r.certificate, r.origins, r.grams, kg3(r.grams), pct4(r.pct)]
          : [r.key, r.label, r.origins, r.grams, kg3(r.grams), pct4(r.pct)],
  );
  const total: CsvCell[] = head.map((_, i) => (i === 0 ? "TOTAL" : null));
  total[head.length - 3] = totalG;
  total[head.length - 2] = kg3(totalG);
  total[head.length - 1] = pct4(totalPct);
  return [head, ...body, total];
}

function tablesCsv(t: ContributionTables, table: Exclude<BackwardTable, "reagents" | "origins">): CsvCell[][] {
  switch (table) {
    case "sources":
      return contributionCsv("source", t.bySource, t.totalG, "source");
    case "lots":
      return contributionCsv("lot", t.byLot, t.totalG, "lot");
    case "pickups":
      return contributionCsv("pickup", t.byPickup, t.totalG, "pickup");
    case "materials":
      return contributionCsv("material_kind", t.byMaterial, t.totalG, "plain");
    case "certification":
      return contributionCsv("certification", t.byCertification, t.totalG, "plain");
  }
}

/** One table of a backward trace; `feedstockOnly` uses the view renormalised over feedstock. */
export function backwardCsv(r: BackwardTraceReport, table: BackwardTable, feedstockOnly: boolean): string {
  if (table === "reagents") {
    // Reagent shares are of the whole traced quantity, so the total row gives the reagents' share of it.
    return toCsv(
      contributionCsv(
        "reagent_lot",
        r.reagents,
        r.reagentsG,
        "plain",
        r.totalG === 0 ? 0 : (r.reagentsG * 100) / r.totalG,
      ),
    );
  }
  if (table === "origins") {
    const rows = r.origins.filter((o) => !feedstockOnly || o.certification !== "NOT_FEEDSTOCK");
    const totalG = rows.reduce((s, o) => s + o.grams, 0);
    return toCsv([
      [
        "origin_movement",
        "entered_at",
        "entered_at_holder_kind",
        "entered_at_holder",
        "pickup",
        "lot",
        "source",
        "source_name",
        "material",
        "certification",
        "certificate",
        "grams",
        "kg",
        "percent",
      ],
      ...rows.map((o): CsvCell[] => [
        o.originId,
        o.enteredAt.toISOString(),
        o.entryHolder ? o.entryHolder.kind : null,
        o.entryHolder ? o.entryHolder.code : null,
        o.pickupCode,
        o.lotCode,
        o.sourceCode,
        o.sourceName,
        o.materialKind,
        o.certification,
        o.certificate,
        o.grams,
        kg3(o.grams),
        pct4(totalG === 0 ? 0 : (o.grams * 100) / totalG),
      ]),
      [
        "TOTAL",
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        totalG,
        kg3(totalG),
        rows.length === 0 ? "0.0000" : "100.0000",
      ],
    ]);
  }
  return toCsv(tablesCsv(feedstockOnly ? r.feedstock : r.all, table));
}

export function forwardCsv(r: ForwardTraceReport): string {
  return toCsv([
    [
      "stage",
      "holder_kind",
      "holder",
      "first_reached",
      "received_grams",
      "received_kg",
      "held_grams",
      "held_kg",
      "customer",
    ],
    ...r.holders.map((h): CsvCell[] => [
      h.stageLabel,
      labelOf(h.holder.kind),
      h.holder.code,
      h.firstAt?.toISOString() ?? null,
      h.receivedG,
      kg3(h.receivedG),
      h.heldG,
      kg3(h.heldG),
      h.customer?.name ?? null,
    ]),
    ["TOTAL entered", null, r.subject.code, null, null, null, r.enteredG, kg3(r.enteredG), null],
  ]);
}

/** A file name from the trace subject, safe for a Content-Disposition header. */
export function csvFileName(parts: readonly string[]): string {
  return `${parts.join("-").replace(/[^A-Za-z0-9._-]+/g, "_")}.csv`;
}
