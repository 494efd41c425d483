// The waste list for the hauler: every container on site with its stream, quantity, due date,
// characterisation and hazard flags, the usual cautions for the streams on the list, and totals by
// stream. Built from the waste-due page's own answer, so the page, CSV and PDF agree. Pure.
import { labelOf } from "@/lib/core/vocabulary";
import type { WasteStream } from "@/lib/core/vocabulary";
import { STREAM_CAUTIONS } from "@/lib/waste/container-rules";
import { reportDay } from "@/lib/report/report";
import type { ReportContext, ReportDoc, ReportTable } from "@/lib/report/report";
import { composeReport } from "@/lib/report/report";
import type { ContainerDueRow, WasteDueReport } from "@/app/waste/due/due-report";

const CLOSING_CAUTION = "Follow the safety data sheets, the site's procedures and local codes; they govern.";

function characterisation(c: ContainerDueRow["characterisation"]): string {
  const parts = [
    c.methanolPct === null ? null : `methanol ${c.methanolPct.toFixed(1)} %`,
    c.pH === null ? null : `pH ${c.pH.toFixed(1)}`,
    c.flashPointC === null ? null : `flash point ${c.flashPointC.toFixed(0)} °C`,
    c.waterPct === null ? null : `water ${c.waterPct.toFixed(1)} %`,
  ].filter((p): p is string => p !== null);
  return parts.length === 0 ? "not measured" : parts.join(", ");
}

function hazardText(h: ContainerDueRow["hazard"]): string {
  const flag = (f: ContainerDueRow["hazard"]["ignitable"], word: string) =>
    `${word} ${f.status === "YES" ? "yes" : f.status === "NO" ? "no" : "unknown"} (${f.code})`;
  const overall =
    h.overall === "HAZARDOUS"
      ? "hazardous"
      : h.overall === "NON_HAZARDOUS"
        ? "not hazardous"
        : "needs characterisation (handled as hazardous)";
  return `${overall}; ${flag(h.ignitable, "ignitable")}, ${flag(h.corrosive, "corrosive")}${h.listedCodes.length ? `; listed ${h.listedCodes.join(", ")}` : ""}`;
}

function containersTable(r: WasteDueReport): ReportTable {
  return {
    key: "containers",
    heading: "Containers on site",
    columns: [
      { key: "container", header: "Container", kind: "text" },
      { key: "stream", header: "Stream", kind: "text" },
      { key: "state", header: "State", kind: "text" },
      { key: "mass", header: "Mass", kind: "mass" },
      { key: "volume_l", header: "Volume (L, estimate)", kind: "text" },
      { key: "accumulation_start", header: "Accumulating since", kind: "day" },
      { key: "due", header: "Must go by", kind: "text" },
      { key: "characterisation", header: "Characterisation", kind: "text" },
      { key: "hazard", header: "Hazard", kind: "text" },
    ],
    rows: r.containers.map((c) => [
      c.code,
      labelOf(c.stream),
      labelOf(c.status),
      c.massG,
      (c.volumeMl / 1000).toFixed(1),
      c.accumulationStart,
      c.due?.dueDate ? `${c.due.dueDate}${c.overdue ? " (overdue)" : ""}` : "no time limit",
      characterisation(c.characterisation),
      hazardText(c.hazard),
    ]),
    total: [
      "TOTAL",
      null,
      null,
      r.containers.reduce((s, c) => s + c.massG, 0),
      (r.containers.reduce((s, c) => s + c.volumeMl, 0) / 1000).toFixed(1),
      null,
      null,
      null,
      null,
    ],
    empty: "No waste container is open or full on site.",
  };
}

function byStreamTable(r: WasteDueReport): ReportTable {
  return {
    key: "due-by-stream",
    heading: `Due within ${r.query.days} days, by stream`,
    columns: [
      { key: "stream", header: "Stream", kind: "text" },
      { key: "containers", header: "Containers", kind: "count" },
      { key: "mass", header: "Mass", kind: "mass" },
      { key: "litres", header: "Volume (L, estimate)", kind: "text" },
      { key: "us_gal", header: "Volume (US gal, estimate)", kind: "text" },
    ],
    rows: r.groups.map((g) => [
      labelOf(g.stream),
      g.items.length,
      g.items.reduce((s, i) => s + i.massG, 0),
      g.totals.litres.toFixed(1),
      g.totals.usGallons.toFixed(1),
    ]),
    total: [
      "TOTAL",
      r.totals.count,
      r.groups.reduce((s, g) => s + g.items.reduce((t, i) => t + i.massG, 0), 0),
      r.totals.litres.toFixed(1),
      r.totals.usGallons.toFixed(1),
    ],
    empty: `Nothing falls due within ${r.query.days} days.`,
  };
}

export function buildWasteListDoc(r: WasteDueReport, ctx: ReportContext, ledger: ReportDoc["ledger"]): ReportDoc {
  const streams = [...new Set(r.containers.map((c) => c.stream))] as WasteStream[];
  return composeReport(
    {
      slug: "waste-list",
      title: "Waste list for the hauler",
      subject: `Waste on site on ${reportDay(ctx.producedAt, ctx.timeZone)}, due within ${r.query.days} days (to ${reportDay(r.horizonAt, ctx.timeZone)})`,
      facts: [
        ["Rule set", `${r.ruleSet.name}, ${r.ruleSet.edition}`],
        ["Generator category", `${r.query.category}${r.categoryAssumed ? " (assumed)" : ""}`],
        [
          "Due in that time",
          `${r.totals.count} containers, ${r.totals.kg.toFixed(1)} kg, ${r.totals.litres.toFixed(1)} L, ${r.totals.usGallons.toFixed(1)} US gal`,
        ],
      ],
      notes: [r.localRulesNote, r.densityNote],
      cautions: [...streams.flatMap((s) => STREAM_CAUTIONS[s] ?? []), CLOSING_CAUTION],
      tables: [containersTable(r), byStreamTable(r)],
    },
    ctx,
    ledger,
  );
}
