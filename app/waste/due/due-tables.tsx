// The tables of the waste-due page: what falls due per stream with the hauler's totals, every container
// on site with its hazard flags, and the limits of the rule set with their sources.
import Link from "next/link";
import { labelOf } from "@/lib/core/vocabulary";
import type { DueItem, HazardFlag, StreamGroup, WasteRuleSet } from "@/lib/waste/waste-due";
import { convertVolume } from "@/lib/quantity/units";
import { day, kg, litres, num, pct } from "@/app/_ui/format";
import { Note } from "@/app/_ui/ui";
import { ConfidenceMark, DataTable } from "@/app/_ui/kit";
import { levelOf, screenText, statusNote } from "@/lib/spec/source-text";
import type { ContainerDueRow } from "@/app/waste/due/due-report";

const HAZARD_WORDS: Readonly<Record<string, string>> = {
  HAZARDOUS: "Hazardous",
  NEEDS_CHARACTERISATION: "Needs characterisation",
  NON_HAZARDOUS: "Not hazardous",
};

function HaulLink({ code }: { code: string }) {
  return (
    <Link href={`/waste/${encodeURIComponent(code)}#haul-away`} aria-label={`Record haul-away of ${code}`}>
      Record haul-away
    </Link>
  );
}

function Flag({ f }: { f: HazardFlag }) {
  const cls = f.status === "YES" ? "status-fail" : f.status === "UNKNOWN" ? "status-warn" : "status-pass";
  const word = f.status === "YES" ? `${f.code} yes` : f.status === "UNKNOWN" ? `${f.code} unknown` : `${f.code} no`;
  return (
    <span className={`status ${cls}`} title={`${f.reason} (${screenText(f.source)})`}>
      {word}
    </span>
  );
}

function characterisationText(c: ContainerDueRow["characterisation"]): string {
  const parts = [
    c.methanolPct === null ? null : `methanol ${pct(c.methanolPct, 1)}`,
    c.pH === null ? null : `pH ${num(c.pH, 1)}`,
    c.flashPointC === null ? null : `flash ${num(c.flashPointC, 0)} °C`,
    c.waterPct === null ? null : `water ${pct(c.waterPct, 1)}`,
  ].filter((p): p is string => p !== null);
  return parts.length === 0 ? "not measured" : parts.join(", ");
}

const containerLink = (code: string) => <Link href={`/waste/${encodeURIComponent(code)}`}>{code}</Link>;

/** One stream's containers due within the horizon, with the totals the hauler needs. */
export function StreamTable({ g }: { g: StreamGroup }) {
  const t = g.totals;
  return (
    <DataTable<DueItem>
      caption={`${labelOf(g.stream)}: ${t.count} container${t.count === 1 ? "" : "s"}, ${num(t.kg, 1)} kg, ${num(t.litres, 1)} L, ${num(t.usGallons, 1)} US gal`}
      rows={g.items}
      rowKey={(d) => d.code}
      empty="Nothing due in this stream."
      columns={[
        { key: "code", header: "Container", cell: (d) => containerLink(d.code), total: "For the hauler" },
        {
          key: "due",
          header: "Due",
          cell: (d) => (
            <span className="nowrap">
              {d.dueDate} {d.overdue ? <span className="status status-overdue">overdue</span> : null}
            </span>
          ),
        },
        { key: "left", header: "Days left", numeric: true, cell: (d) => d.daysLeft },
        {
          key: "basis",
          header: "Basis",
          cell: (d) => `${d.limitDays === null ? "" : `${d.limitDays} days, `}${screenText(d.source)}`,
        },
        { key: "mass", header: "Mass", numeric: true, cell: (d) => kg(d.massG, 1), total: `${num(t.kg, 1)} kg` },
        {
          key: "volume",
          header: "Volume (est.)",
          numeric: true,
          cell: (d) => litres(d.volumeMl, 1),
          total: `${num(t.litres, 1)} L`,
        },
        {
          key: "gal",
          header: "US gal (est.)",
          numeric: true,
          cell: (d) => num(convertVolume(d.volumeMl, "mL", "gal"), 1),
          total: num(t.usGallons, 1),
        },
        { key: "haul", header: "Haul-away", cell: (d) => <HaulLink code={d.code} /> },
      ]}
    />
  );
}

function MustGoBy({ c }: { c: ContainerDueRow }) {
  if (c.due === null) return <span className="muted">not assessed</span>;
  if (c.due.dueDate === null) return <span className="muted">no time limit</span>;
  return (
    <span className="nowrap" title={screenText(c.due.source)}>
      {c.due.dueDate}{" "}
      {c.overdue ? (
        <span className="status status-overdue">overdue</span>
      ) : (
        <span className="muted">({c.daysLeft} d)</span>
      )}
    </span>
  );
}

/** Every container on site with its characterisation, hazard flags and the date it must go. */
export function ContainersOnSiteTable({ containers, timeZone }: { containers: ContainerDueRow[]; timeZone: string }) {
  return (
    <DataTable<ContainerDueRow>
      caption="Every container on site"
      hideCaption
      rows={containers}
      rowKey={(c) => c.code}
      empty="No waste container is on site."
      columns={[
        {
          key: "code",
          header: "Container",
          cell: (c) => (
            <span className="nowrap">
              {containerLink(c.code)}
              {c.satellite ? <span className="tag">satellite</span> : null}
            </span>
          ),
        },
        { key: "stream", header: "Stream", cell: (c) => labelOf(c.stream) },
        { key: "start", header: "Accumulation start", cell: (c) => day(c.accumulationStart, timeZone) },
        {
          key: "qty",
          header: "Quantity",
          numeric: true,
          cell: (c) => (
            <>
              {kg(c.massG, 1)}
              <br />
              <span className="muted">{litres(c.volumeMl, 0)}</span>
            </>
          ),
        },
        { key: "char", header: "Characterisation", cell: (c) => characterisationText(c.characterisation) },
        { key: "d001", header: "Ignitable", cell: (c) => <Flag f={c.hazard.ignitable} /> },
        { key: "d002", header: "Corrosive", cell: (c) => <Flag f={c.hazard.corrosive} /> },
        { key: "overall", header: "Assessment", cell: (c) => HAZARD_WORDS[c.hazard.overall] ?? c.hazard.overall },
        { key: "due", header: "Must go by", cell: (c) => <MustGoBy c={c} /> },
        { key: "haul", header: "Haul-away", cell: (c) => <HaulLink code={c.code} /> },
      ]}
    />
  );
}

export function HazardRulesNote({ rs }: { rs: WasteRuleSet }) {
  return (
    <Note>
      Ignitable (D001): a liquid with a closed-cup flash point below {rs.ignitableFlashPointBelowC.value} °C, unless
      aqueous with less than {rs.ignitableAqueousAlcoholBelowPctVol.value} % alcohol (
      {rs.ignitableFlashPointBelowC.source}). Corrosive (D002): aqueous with pH ≤ {rs.corrosivePhAtMost.value} or ≥{" "}
      {rs.corrosivePhAtLeast.value} ({rs.corrosivePhAtLeast.source}). A container without the measurements is handled as
      hazardous until characterised.
    </Note>
  );
}

type Limit = { label: string; v: WasteRuleSet["lqgMaxDays"] };

/** Each limit of the rule set with its value, source and how sure that source is. */
export function RuleLimitsTable({ rs }: { rs: WasteRuleSet }) {
  const rows: Limit[] = [
    { label: "LQG accumulation", v: rs.lqgMaxDays },
    { label: "SQG accumulation", v: rs.sqgMaxDays },
    { label: "SQG, treatment facility far away", v: rs.sqgLongHaulMaxDays },
    { label: "SQG long-haul distance", v: rs.sqgLongHaulMinMiles },
    { label: "SQG on-site quantity", v: rs.sqgMaxOnSiteKg },
    { label: "VSQG on-site quantity", v: rs.vsqgMaxOnSiteKg },
    { label: "Satellite area volume", v: rs.satelliteMaxUsGal },
    { label: "Satellite excess removed within", v: rs.satelliteExcessDays },
    { label: "Non-hazardous streams (site rule)", v: rs.nonHazardousMaxStorageDays },
  ];
  return (
    <DataTable<Limit>
      caption="Limits of the rule set"
      hideCaption
      rows={rows}
      rowKey={(l) => l.label}
      empty="The rule set has no limits."
      columns={[
        { key: "label", header: "Limit", cell: (l) => l.label },
        {
          key: "value",
          header: "Value",
          numeric: true,
          cell: (l) => (
            <span className="nowrap">
              {l.v.value} {l.v.unit}
            </span>
          ),
        },
        { key: "source", header: "Source", cell: (l) => screenText(l.v.source) },
        {
          key: "sure",
          header: "How sure",
          cell: (l) => (
            <>
              <ConfidenceMark level={levelOf(l.v.status)} anchor={`waste-${l.label}`} /> {statusNote(l.v.status)}
            </>
          ),
        },
      ]}
    />
  );
}
