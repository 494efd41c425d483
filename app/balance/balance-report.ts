// The period balance statement: built from the balance page's own answer (BalanceReport), so every
// line the balance computes (including lines added later) is printed, and the page, CSV and PDF agree. Pure.
import type { BalanceReport } from "@/lib/mass-balance/balance.service";
import type { Closure } from "@/lib/mass-balance/period-balance";
import { reportDay } from "@/lib/report/report";
import type { ReportContext, ReportDoc, ReportTable } from "@/lib/report/report";
import { composeReport, periodDays } from "@/lib/report/report";

const FLAG_WORDS: Readonly<Record<Closure["flag"], string>> = {
  OK: "Within tolerance",
  WARN: "Above the warn level",
  FAIL: "Above the fail level",
};

function closureText(c: Closure): string {
  return `${c.pct === null ? "no base" : `${c.pct.toFixed(3)} %`} (${FLAG_WORDS[c.flag]})`;
}

function statementTable(r: BalanceReport): ReportTable {
  const imbalanceG = r.inputsG - r.outputsG;
  return {
    key: "statement",
    heading: "Balance statement",
    columns: [
      { key: "line", header: "Line", kind: "text" },
      { key: "in", header: "In", kind: "mass" },
      { key: "out", header: "Out", kind: "mass" },
    ],
    rows: [
      ...r.inputs.map((l) => [l.label, l.grams, null]),
      ...r.outputs.map((l) => [l.label, null, l.grams]),
      ["Unaccounted (in minus out)", null, imbalanceG],
    ],
    total: ["TOTAL", r.inputsG, r.outputsG + imbalanceG],
    empty: "Nothing moved.",
  };
}

function materialTable(r: BalanceReport): ReportTable {
  return {
    key: "materials",
    heading: "By material kind",
    columns: [
      { key: "material", header: "Material", kind: "text" },
      { key: "opening", header: "Opening", kind: "mass" },
      { key: "in", header: "In", kind: "mass" },
      { key: "out", header: "Out", kind: "mass" },
      { key: "transfers_out", header: "Transfers out", kind: "mass" },
      { key: "closing", header: "Closing", kind: "mass" },
      { key: "unaccounted", header: "Unaccounted", kind: "mass" },
      { key: "closure", header: "Closure", kind: "text" },
    ],
    rows: r.byMaterial.map((m) => [
      m.label,
      m.openingG,
      m.inG,
      m.outputsG,
      m.transfersOutG,
      m.closingG,
      m.imbalanceG,
      closureText(m.closure),
    ]),
    empty: "No stock holders in the period.",
  };
}

function batchesTable(r: BalanceReport): ReportTable {
  return {
    key: "batches",
    heading: "Batches finished in the period",
    columns: [
      { key: "batch", header: "Batch", kind: "text" },
      { key: "finished", header: "Finished", kind: "day" },
      { key: "inputs", header: "Charged", kind: "mass" },
      { key: "outputs", header: "Out", kind: "mass" },
      { key: "unaccounted", header: "Unaccounted", kind: "mass" },
      { key: "closure", header: "Closure", kind: "text" },
    ],
    rows: r.process.completed.map((b) => [
      b.code,
      b.completedAt === null ? null : new Date(b.completedAt),
      b.inputsG,
      b.outputsG,
      b.imbalanceG,
      closureText(b.closure),
    ]),
    total: ["TOTAL", null, r.process.inputsG, r.process.outputsG, r.process.imbalanceG, closureText(r.process.closure)],
    empty: "No batch finished in the period.",
  };
}

function gaugesTable(r: BalanceReport): ReportTable {
  return {
    key: "gauges",
    heading: "Book stock against the latest tank gauges",
    columns: [
      { key: "tank", header: "Tank", kind: "text" },
      { key: "gauged", header: "Gauged", kind: "time" },
      { key: "book", header: "Book", kind: "mass" },
      { key: "measured", header: "Gauged", kind: "mass" },
      { key: "difference", header: "Difference", kind: "mass" },
      { key: "closure", header: "Closure", kind: "text" },
    ],
    rows: (r.gauges?.rows ?? []).map((g) => [
      g.tankCode,
      g.at,
      g.bookG,
      g.measuredG,
      g.differenceG,
      closureText(g.closure),
    ]),
    ...(r.gauges
      ? {
          total: [
            "TOTAL",
            null,
            r.gauges.total.bookG,
            r.gauges.total.measuredG,
            r.gauges.total.differenceG,
            closureText(r.gauges.total.closure),
          ],
        }
      : {}),
    empty: "No tank has been gauged by the period end.",
  };
}

export function buildBalanceDoc(r: BalanceReport, ctx: ReportContext, ledger: ReportDoc["ledger"]): ReportDoc {
  const ap = r.accountingPeriod;
  return composeReport(
    {
      slug: "balance",
      title: "Period balance statement",
      subject: `Period ${r.period.label}: ${periodDays(r.period.startsAt, r.period.endsAt, ctx.timeZone)}`,
      facts: [
        ["Closure", closureText(r.stock.closure)],
        ["Tolerance", `warn above ${r.tolerance.warnPct} %, fail above ${r.tolerance.failPct} % of inputs`],
        [
          "Accounting period",
          ap === null ? "not recorded" : ap.closedAt ? `closed ${reportDay(ap.closedAt, ctx.timeZone)}` : "open",
        ],
      ],
      notes: [
        "Whole grams from the movement ledger: opening stock and everything received equal everything that left, closing stock and what is unaccounted for.",
      ],
      tables: [statementTable(r), materialTable(r), batchesTable(r), gaugesTable(r)],
    },
    ctx,
    ledger,
  );
}
