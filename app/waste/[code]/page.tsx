import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import type { HolderKind, WasteStream } from "@/lib/core/vocabulary";
import { getWasteContainerDetail } from "@/lib/waste/container.store";
import type { ContainerMovement, DisposalOfContainer, WasteContainerDetail } from "@/lib/waste/container.store";
import { characterisationOf, STREAM_CAUTIONS } from "@/lib/waste/container-rules";
import { assessWasteHazards } from "@/lib/waste/waste-due";
import type { HazardAssessment, HazardFlag } from "@/lib/waste/waste-due";
import { Cautions, ConfidenceMark, DataTable, RecordHeader } from "@/app/_ui/kit";
import { day, daysBetween, kg, litres, num, pct, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { HistoryLink, HolderLink, NoSite, Note } from "@/app/_ui/ui";
import { getWasteDueReportCached } from "@/app/waste/due/due-report-cache";
import type { ContainerDueRow } from "@/app/waste/due/due-report";
import { CharacterisationForm, HaulForm, MarkFullForm } from "@/app/waste/container-forms";
import { levelOf, screenText } from "@/lib/spec/source-text";
import { haulColumns } from "@/app/waste/haul-columns";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Waste container ${codeParam((await params).code)}` };
}

/** Plain words for the measurements a hazard flag is still missing. */
const MISSING_WORDS: Readonly<Record<string, string>> = {
  flashPointC: "closed-cup flash point",
  pH: "pH",
  methanolPct: "methanol content",
  "aqueous or waterPct": "water content",
  physicalState: "whether it is liquid or solid",
  solidIgnitable: "a determination whether the solid is ignitable",
};

function flagWord(f: HazardFlag) {
  const word = f.status === "YES" ? "Yes" : f.status === "NO" ? "No" : "Not known yet";
  const cls = f.status === "YES" ? "status-fail" : f.status === "UNKNOWN" ? "status-warn" : "status-pass";
  return <span className={`status ${cls}`}>{word}</span>;
}

function flagReason(f: HazardFlag) {
  const missing = f.missing.map((m) => MISSING_WORDS[m] ?? m);
  return (
    <>
      {f.reason}
      {missing.length > 0 ? <span className="muted"> — still needed: {missing.join(", ")}</span> : null}
    </>
  );
}

export default async function WasteContainerPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const code = codeParam((await params).code).toUpperCase();
  const c = await getWasteContainerDetail(db, site.id, code);
  if (!c) notFound();
  const tz = site.timeZone;
  const now = user.now;
  const nowLocal = when(now, tz).replace(" ", "T");
  // A haul is usually typed right after the last output went in: its default is the next whole minute, so
  // a time rounded down to the minute cannot fall before a booking made earlier in the same minute.
  const haulLocal = when(new Date(Math.ceil((now.getTime() + 1) / 60_000) * 60_000), tz).replace(" ", "T");
  const stream = c.stream as WasteStream;
  const onSite = c.status !== "SHIPPED";
  // The same report the waste-due list reads, so both pages always agree on the date.
  const report = onSite ? await getWasteDueReportCached(db, site, {}, now) : null;
  const due = report?.ok ? report.value.containers.find((r) => r.code === c.code) : undefined;
  const hazard = due?.hazard ?? assessWasteHazards(stream, characterisationOf(c));
  const canRecord = user.role === "PRODUCTION" || user.role === "COMPLIANCE";
  const canHaul = user.role === "COMPLIANCE";
  const lastOut = c.disposals.at(-1)?.disposedAt ?? null;

  return (
    <>
      <RecordHeader
        kind="Waste container"
        number={c.code}
        status={{ code: c.status }}
        back={{ href: "/waste", label: "Waste" }}
        facts={[
          ["Stream", labelOf(c.stream)],
          ["Location", c.location || <span className="muted">not recorded</span>],
          ["Accumulation start", when(c.accumulationStart, tz)],
          ["Days on site", onSite ? String(daysBetween(c.accumulationStart, now)) : "—"],
          ["Must go by", <DueText due={due} onSite={onSite} hauledAt={lastOut} timeZone={tz} />],
          ["Contents (book stock)", kg(c.stockG, 1)],
          ["Capacity", litres(c.capacityMl, 0)],
          ["Satellite area", c.satellite ? "Yes" : "No"],
          ["Full on", c.fullAt ? when(c.fullAt, tz) : <span className="muted">not marked full</span>],
          ["Hazard assessment", labelOf(hazard.overall)],
        ]}
        actions={<HistoryLink kind="waste" recordKey={c.code} label="waste container" />}
      />

      <Cautions
        title={`Handling ${labelOf(c.stream).toLowerCase()}`}
        items={STREAM_CAUTIONS[stream] ?? STREAM_CAUTIONS.OTHER}
      />

      <HazardSection hazard={hazard} />

      <CharacterisationSection c={c} timeZone={tz} nowLocal={nowLocal} canRecord={onSite && canRecord} />

      {c.status === "OPEN" && canRecord ? <MarkFullSection code={c.code} nowLocal={nowLocal} /> : null}

      {onSite ? <HaulSection code={c.code} stockG={c.stockG} canHaul={canHaul} haulLocal={haulLocal} /> : null}

      <HaulsTable rows={c.disposals} timeZone={tz} />

      <MovementsTable rows={c.movements} timeZone={tz} />
    </>
  );
}

function MarkFullSection({ code, nowLocal }: { code: string; nowLocal: string }) {
  return (
    <section aria-labelledby="full">
      <h2 id="full">Mark full</h2>
      <p>A full container takes no more batch outputs and waits for the hauler.</p>
      <MarkFullForm containerCode={code} nowLocal={nowLocal} />
    </section>
  );
}

function HaulSection(p: { code: string; stockG: number; canHaul: boolean; haulLocal: string }) {
  return (
    <section aria-labelledby="haul" id="haul-away">
      <h2 id="haul">Record a haul-away</h2>
      <p>
        The container holds <strong>{kg(p.stockG, 1)}</strong> on the books. When a haul takes all of it the container
        is marked hauled away.
      </p>
      {p.canHaul ? (
        <HaulForm containerCode={p.code} nowLocal={p.haulLocal} />
      ) : (
        <Note>Compliance staff record haul-aways.</Note>
      )}
    </section>
  );
}

function HazardSection({ hazard }: { hazard: HazardAssessment }) {
  return (
    <section aria-labelledby="hazard">
      <h2 id="hazard">Hazard assessment: {labelOf(hazard.overall)}</h2>
      <DataTable<{ what: string; f: HazardFlag }>
        caption="Hazard characteristics"
        hideCaption
        rows={[
          { what: "Ignitable", f: hazard.ignitable },
          { what: "Corrosive", f: hazard.corrosive },
        ]}
        rowKey={(r) => r.f.code}
        empty="No hazard characteristics assessed."
        columns={[
          { key: "what", header: "Characteristic", cell: (r) => `${r.what} (${r.f.code})` },
          { key: "applies", header: "Applies", cell: (r) => flagWord(r.f) },
          { key: "why", header: "Why", cell: (r) => flagReason(r.f) },
          { key: "rule", header: "Rule", cell: (r) => screenText(r.f.source) },
        ]}
      />
      <Note>
        A container without the measurements is handled as hazardous until it is characterised. Local and state rules
        may be stricter and govern.
      </Note>
    </section>
  );
}

function CharacterisationSection({
  c,
  timeZone,
  nowLocal,
  canRecord,
}: {
  c: WasteContainerDetail;
  timeZone: string;
  nowLocal: string;
  canRecord: boolean;
}) {
  return (
    <section aria-labelledby="characterisation">
      <h2 id="characterisation">Characterisation</h2>
      <dl className="facts">
        <div>
          <dt>Tested</dt>
          <dd>{c.characterisedAt ? when(c.characterisedAt, timeZone) : <span className="muted">not yet</span>}</dd>
        </div>
        <div>
          <dt>Methanol</dt>
          <dd>{c.methanolPct === null ? "—" : `${pct(c.methanolPct, 1)} v/v`}</dd>
        </div>
        <div>
          <dt>pH</dt>
          <dd>{num(c.pH, 1)}</dd>
        </div>
        <div>
          <dt>Flash point, closed cup</dt>
          <dd>{c.flashPointC === null ? "—" : `${num(c.flashPointC, 0)} °C`}</dd>
        </div>
        <div>
          <dt>Water</dt>
          <dd>{c.waterPct === null ? "—" : `${pct(c.waterPct, 1)} by weight`}</dd>
        </div>
      </dl>
      {canRecord ? (
        <details className="record-form">
          <summary>Record a new characterisation</summary>
          <p className="muted">The new results replace the ones above; a value left empty was not measured.</p>
          <CharacterisationForm containerCode={c.code} nowLocal={nowLocal} />
        </details>
      ) : null}
    </section>
  );
}

function HaulsTable({ rows, timeZone }: { rows: DisposalOfContainer[]; timeZone: string }) {
  return (
    <section aria-labelledby="hauls">
      <h2 id="hauls">Hauls</h2>
      <DataTable<DisposalOfContainer>
        caption="Hauled from this container"
        hideCaption
        rows={rows}
        rowKey={(d) => d.documentNo}
        empty="Nothing hauled from this container yet."
        columns={[
          ...haulColumns<DisposalOfContainer>(timeZone),
          { key: "mass", header: "Quantity", unit: "kg", numeric: true, cell: (d) => num(d.massG / 1000, 3) },
        ]}
      />
    </section>
  );
}

function MovementsTable({ rows, timeZone }: { rows: ContainerMovement[]; timeZone: string }) {
  return (
    <section aria-labelledby="movements">
      <h2 id="movements">Movements in and out</h2>
      <DataTable<ContainerMovement>
        caption="Movements in and out"
        hideCaption
        rows={rows}
        rowKey={(m) => m.id}
        empty="Nothing has gone into this container yet."
        columns={[
          { key: "no", header: "No.", cell: (m) => m.id },
          { key: "at", header: "When", cell: (m) => when(m.at, timeZone) },
          { key: "dir", header: "In or out", cell: (m) => (m.direction === "IN" ? "In" : "Out") },
          { key: "role", header: "What", cell: (m) => labelOf(m.role) },
          {
            key: "other",
            header: "From or to",
            cell: (m) => (
              <HolderLink
                holder={
                  m.otherKind === null || m.otherCode === null
                    ? null
                    : { kind: m.otherKind as HolderKind, code: m.otherCode }
                }
              />
            ),
          },
          {
            key: "mass",
            header: "Mass",
            unit: "kg",
            numeric: true,
            cell: (m) => `${m.direction === "OUT" ? "−" : "+"}${num(m.massG / 1000, 3)}`,
          },
        ]}
      />
    </section>
  );
}

function DueText({
  due,
  onSite,
  hauledAt,
  timeZone,
}: {
  due: ContainerDueRow | undefined;
  onSite: boolean;
  hauledAt: Date | null;
  timeZone: string;
}) {
  return !onSite ? (
    <span className="muted">hauled away {day(hauledAt, timeZone)}</span>
  ) : due?.due === null || due === undefined ? (
    <span className="muted">not worked out</span>
  ) : due.due.dueDate === null ? (
    <span className="muted">no time limit below the satellite or very-small-generator limits</span>
  ) : (
    <span>
      {due.due.dueDate}{" "}
      {due.overdue ? (
        <span className="status status-overdue">overdue</span>
      ) : (
        <span className="muted">({due.daysLeft} days left)</span>
      )}{" "}
      <span className="muted">
        {due.due.limitDays} days, {screenText(due.due.source)}
      </span>{" "}
      <ConfidenceMark level={levelOf(due.due.status)} anchor="waste-accumulation-time" />
    </span>
  );
}
