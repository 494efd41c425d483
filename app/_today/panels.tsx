// The panels of the home page, each a kit table: tanks, lots awaiting the lab, batches in progress,
// waste on site.
import Link from "next/link";
import type { Dashboard } from "@/app/_today/today";
import type { WasteDueBoard } from "@/lib/waste/container.store";
import { labelOf } from "@/lib/core/vocabulary";
import { day, daysBetween, kg, litres, pct, when } from "@/app/_ui/format";
import { DensityNote, FillBar } from "@/app/_ui/tank-ui";
import { CodeLink, Note, Status } from "@/app/_ui/ui";
import type { Column } from "@/app/_ui/kit/data-table";
import { DataTable } from "@/app/_ui/kit/data-table";

type Tank = Dashboard["tanks"][number];
type Lot = Dashboard["quarantinedLots"][number];
type Batch = Dashboard["batchesInProgress"][number];
type Waste = Dashboard["wasteOnSite"][number];

export function TankPanel({ d, tz }: { d: Dashboard; tz: string }) {
  const columns: Column<Tank>[] = [
    {
      key: "tank",
      header: "Tank",
      cell: (t) => (
        <>
          <CodeLink href={`/tanks/${encodeURIComponent(t.code)}`} code={t.code} />{" "}
          <span className="muted">{t.name}</span>
        </>
      ),
    },
    { key: "service", header: "Service", cell: (t) => labelOf(t.service) },
    { key: "stock", header: "Book stock", numeric: true, cell: (t) => kg(t.stockG) },
    { key: "capacity", header: "Capacity", numeric: true, cell: (t) => litres(t.capacityMl, 0) },
    { key: "fill", header: "Fill (estimate)", cell: (t) => <FillBar tank={t} /> },
    {
      key: "gauge",
      header: "Last gauge",
      cell: (t) =>
        t.lastGauge ? (
          <span className="nowrap">
            {litres(t.lastGauge.volumeMl, 0)} <span className="muted">on {day(t.lastGauge.at, tz)}</span>
          </span>
        ) : (
          <span className="muted">none</span>
        ),
    },
  ];
  return (
    <section className="panel wide" aria-labelledby="tanks-h">
      <h2 id="tanks-h">Tank levels</h2>
      <DataTable
        caption="Tank levels"
        hideCaption
        columns={columns}
        rows={d.tanks}
        rowKey={(t) => t.code}
        empty="No tanks recorded yet."
      />
      {d.tanks.length > 0 ? <DensityNote tanks={d.tanks} /> : null}
    </section>
  );
}

export function LabPanel({ d, tz }: { d: Dashboard; tz: string }) {
  const columns: Column<Lot>[] = [
    { key: "lot", header: "Lot", cell: (l) => <CodeLink href={`/lots/${encodeURIComponent(l.code)}`} code={l.code} /> },
    { key: "material", header: "Material", cell: (l) => labelOf(l.material) },
    { key: "received", header: "Received", cell: (l) => <span className="nowrap">{when(l.receivedAt, tz)}</span> },
    { key: "mass", header: "Mass", numeric: true, cell: (l) => kg(l.massG) },
    {
      key: "ffa",
      header: "FFA",
      numeric: true,
      cell: (l) => (l.ffaPct === null ? <span className="muted">not yet</span> : pct(l.ffaPct)),
    },
  ];
  return (
    <section className="panel" aria-labelledby="lab-h">
      <h2 id="lab-h">Lots waiting for lab results</h2>
      <DataTable
        caption="Lots waiting for lab results"
        hideCaption
        columns={columns}
        rows={d.quarantinedLots}
        rowKey={(l) => l.code}
        empty="No lots are waiting for the lab."
      />
      {d.quarantinedTotal > d.quarantinedLots.length ? (
        <Note>
          Showing {d.quarantinedLots.length} of {d.quarantinedTotal}. <Link href="/lots">All lots</Link>
        </Note>
      ) : null}
    </section>
  );
}

export function BatchPanel({ d, tz }: { d: Dashboard; tz: string }) {
  const columns: Column<Batch>[] = [
    {
      key: "batch",
      header: "Batch",
      cell: (b) => <CodeLink href={`/batches/${encodeURIComponent(b.code)}`} code={b.code} />,
    },
    { key: "status", header: "Status", cell: (b) => <Status code={b.status} /> },
    { key: "planned", header: "Planned", cell: (b) => <span className="nowrap">{when(b.plannedAt, tz)}</span> },
    { key: "started", header: "Started", cell: (b) => <span className="nowrap">{when(b.startedAt, tz)}</span> },
    { key: "oil", header: "Target oil", numeric: true, cell: (b) => kg(b.targetOilG) },
  ];
  return (
    <section className="panel" aria-labelledby="batches-h">
      <h2 id="batches-h">Batches in progress</h2>
      <DataTable
        caption="Batches in progress"
        hideCaption
        columns={columns}
        rows={d.batchesInProgress}
        rowKey={(b) => b.code}
        empty="No batches are planned or reacting."
      />
    </section>
  );
}

function DueCell({ due }: { due: { dueDate: string | null; overdue: boolean; daysLeft: number | null } | undefined }) {
  if (due === undefined) return <span className="muted">not assessed</span>;
  if (due.dueDate === null) return <span className="muted">no time limit</span>;
  return (
    <span className="nowrap">
      {due.dueDate}{" "}
      {due.overdue ? (
        <span className="status status-overdue">overdue</span>
      ) : (
        <span className="muted">({due.daysLeft} days left)</span>
      )}
    </span>
  );
}

export function WastePanel({
  d,
  waste,
  tz,
  now,
}: {
  d: Dashboard;
  waste: WasteDueBoard | null;
  tz: string;
  now: Date;
}) {
  const columns: Column<Waste>[] = [
    {
      key: "container",
      header: "Container",
      cell: (w) => <Link href={`/waste/${encodeURIComponent(w.code)}`}>{w.code}</Link>,
    },
    { key: "stream", header: "Stream", cell: (w) => labelOf(w.stream) },
    { key: "started", header: "Started", cell: (w) => <span className="nowrap">{day(w.accumulationStart, tz)}</span> },
    { key: "days", header: "Days on site", numeric: true, cell: (w) => daysBetween(w.accumulationStart, now) },
    { key: "due", header: "Due off site", cell: (w) => <DueCell due={waste?.byCode.get(w.code)} /> },
  ];
  return (
    <section className="panel" aria-labelledby="waste-h">
      <h2 id="waste-h">Waste containers on site</h2>
      <DataTable
        caption="Waste containers on site"
        hideCaption
        columns={columns}
        rows={d.wasteOnSite}
        rowKey={(w) => w.code}
        empty="No waste containers are on site."
      />
      {d.wasteOnSite.length > 0 ? (
        <Note>
          {waste
            ? `${waste.assumption.note} Rules: ${waste.ruleSet}. ${waste.note}`
            : "Due dates could not be worked out from the recorded data; days on site are counted from the accumulation start."}{" "}
          <Link href="/waste">Waste details</Link>
        </Note>
      ) : null}
    </section>
  );
}
