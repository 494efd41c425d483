// The backward trace ("what is it made of") as a report: by source, feedstock lot, pickup, material kind
// and certification, with the reagents, from the trace page's own answer. Pure.
import { labelOf } from "@/lib/core/vocabulary";
import { reportTime } from "@/lib/report/report";
import type { ReportContext, ReportDoc, ReportTable } from "@/lib/report/report";
import { composeReport } from "@/lib/report/report";
import type { BackwardTraceReport, ContributionRow } from "@/lib/trace/trace.service";

function contributions(
  key: string,
  heading: string,
  first: string,
  rows: readonly ContributionRow[],
  totalG: number,
): ReportTable {
  return {
    key,
    heading,
    columns: [
      { key: key.replace(/s$/, ""), header: first, kind: "text" },
      { key: "description", header: "Description", kind: "text" },
      { key: "mass", header: "Mass", kind: "mass" },
      { key: "share", header: "Share", kind: "pct" },
    ],
    rows: rows.map((r) => [r.key, r.label, r.grams, r.pct]),
    total: ["TOTAL", null, totalG, rows.length === 0 ? 0 : 100],
    empty: "Nothing in this trace.",
  };
}

export function buildBackwardTraceDoc(r: BackwardTraceReport, ctx: ReportContext): ReportDoc {
  const t = r.all;
  const what = `${labelOf(r.target.kind)} ${r.target.code}`;
  return composeReport(
    {
      slug: "made-of",
      title: "Trace report: what it is made of",
      subject:
        r.basis === "STOCK"
          ? `${what}, what it held${r.asOf ? ` at ${reportTime(r.asOf.at, ctx.timeZone)}` : ""}`
          : `${what}, everything it received`,
      facts: [
        ["Traced", `${(r.totalG / 1000).toFixed(3)} kg`],
        ["Feedstock", `${(r.feedstock.totalG / 1000).toFixed(3)} kg`],
        ["Reagents", `${(r.reagentsG / 1000).toFixed(3)} kg`],
        ["Origins", String(r.origins.length)],
      ],
      notes: [
        "Masses come from replaying the movement ledger under each tank's mixing model, in whole grams; each table adds up exactly to its total.",
      ],
      tables: [
        contributions("sources", "By source", "Source", t.bySource, t.totalG),
        contributions("lots", "By feedstock lot", "Lot", t.byLot, t.totalG),
        contributions("pickups", "By pickup", "Pickup", t.byPickup, t.totalG),
        contributions("materials", "By material kind", "Material", t.byMaterial, t.totalG),
        contributions("certification", "By certification", "Status", t.byCertification, t.totalG),
        {
          ...contributions("reagents", "Reagents", "Reagent lot", r.reagents, r.reagentsG),
          total: ["TOTAL", null, r.reagentsG, r.totalG === 0 ? 0 : (r.reagentsG * 100) / r.totalG],
        },
      ],
    },
    ctx,
    { movements: r.freshness.movements, lastMoveId: r.freshness.lastMoveId },
  );
}
