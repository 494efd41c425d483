import Link from "next/link";
import type { Metadata } from "next";
import { labelOf, WASTE_STREAMS } from "@/lib/core/vocabulary";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { getWasteDueBoard, listDisposals, listWasteContainers } from "@/lib/waste/container.store";
import type { DisposalRow, WasteContainerRow, WasteDueBoard, WasteDueRow } from "@/lib/waste/container.store";
import { day, daysBetween, kg, litres, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, HistoryLink, NoSite, Note, Status } from "@/app/_ui/ui";
import { Cautions, DataTable } from "@/app/_ui/kit";
import { OpenContainerForm } from "@/app/waste/container-forms";
import { haulColumns } from "@/app/waste/haul-columns";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Waste" };

export default async function WastePage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const now = user.now;
  const canOpen = user.role === "PRODUCTION" || user.role === "COMPLIANCE";
  const [containers, disposals, due] = await Promise.all([
    listWasteContainers(db, site.id),
    listDisposals(db, site.id),
    getWasteDueBoard(db, site.id, now, getUtcOffsetMin(site.timeZone, now)),
  ]);
  const tz = site.timeZone;
  return (
    <>
      <h1>Waste</h1>
      <p className="lede">
        Containers that collect glycerol phase, wash water, spent filter media and other waste streams, and the hauls
        that took them away.
      </p>
      <p>
        <a href="/waste/due">What falls due for haul-away, by stream, with totals for the hauler</a>
      </p>

      <h2>Containers</h2>
      <ContainersTable containers={containers} due={due} now={now} timeZone={tz} />
      {containers.length > 0 ? <DueNotes due={due} /> : null}

      {canOpen ? <OpenContainerSection nowLocal={when(now, tz).replace(" ", "T")} /> : null}

      <h2>Disposals</h2>
      <DisposalsTable disposals={disposals} timeZone={tz} />
    </>
  );
}

function DueCell({ d, onSite }: { d: WasteDueRow | undefined; onSite: boolean }) {
  if (!onSite) return <span className="muted">hauled away</span>;
  if (d === undefined) return <span className="muted">not assessed</span>;
  if (d.dueDate === null) return <span className="muted">no time limit</span>;
  return (
    <span>
      {d.dueDate}{" "}
      {d.overdue ? (
        <span className="status status-overdue">overdue</span>
      ) : (
        <span className="muted">({d.daysLeft} d)</span>
      )}
    </span>
  );
}

function ContainersTable(p: {
  containers: WasteContainerRow[];
  due: WasteDueBoard | null;
  now: Date;
  timeZone: string;
}) {
  const dueOf = (c: WasteContainerRow) => p.due?.byCode.get(c.code);
  const onSite = (c: WasteContainerRow) => c.status !== "SHIPPED";
  return (
    <DataTable<WasteContainerRow>
      caption="Waste containers"
      hideCaption
      rows={p.containers}
      rowKey={(c) => c.code}
      rowId={(c) => c.code}
      empty="No waste containers recorded yet."
      columns={[
        {
          key: "code",
          header: "Container",
          cell: (c) => (
            <span className="nowrap">
              <CodeLink href={`/waste/${encodeURIComponent(c.code)}`} code={c.code} />
              {c.satellite ? <span className="tag">satellite</span> : null}
            </span>
          ),
        },
        { key: "stream", header: "Stream", cell: (c) => labelOf(c.stream) },
        { key: "location", header: "Location", cell: (c) => c.location || <span className="muted">—</span> },
        { key: "status", header: "Status", cell: (c) => <Status code={c.status} /> },
        { key: "start", header: "Started", cell: (c) => day(c.accumulationStart, p.timeZone) },
        {
          key: "days",
          header: "Days on site",
          numeric: true,
          cell: (c) => (onSite(c) ? daysBetween(c.accumulationStart, p.now) : "—"),
        },
        { key: "due", header: "Due off site", cell: (c) => <DueCell d={dueOf(c)} onSite={onSite(c)} /> },
        {
          key: "hazard",
          header: "Hazard",
          cell: (c) => {
            const d = dueOf(c);
            return d ? labelOf(d.hazard) : <span className="muted">—</span>;
          },
        },
        { key: "stock", header: "Book stock", numeric: true, cell: (c) => kg(c.stockG) },
        { key: "capacity", header: "Capacity", numeric: true, cell: (c) => litres(c.capacityMl, 0) },
        {
          key: "history",
          header: "History",
          cell: (c) => <HistoryLink kind="waste" recordKey={c.code} label="waste container" />,
        },
      ]}
    />
  );
}

function DueNotes({ due }: { due: WasteDueBoard | null }) {
  if (!due)
    return (
      <Note>
        Due dates could not be worked out from the recorded data; days on site count from the accumulation start.
      </Note>
    );
  return (
    <>
      <Note>
        Due dates from {due.ruleSet}. {due.assumption.note} Containers marked satellite are treated as one satellite
        area, with their volume estimated from book mass at a nominal density. {due.note}{" "}
        <Link href="/waste/rules">Waste rule set</Link>
      </Note>
      {due.issues.length > 0 ? (
        <ul className="warning" aria-label="Waste warnings">
          {due.issues.map((i) => (
            <li key={i}>{i}</li>
          ))}
        </ul>
      ) : null}
    </>
  );
}

function OpenContainerSection({ nowLocal }: { nowLocal: string }) {
  return (
    <section aria-labelledby="open-container">
      <h2 id="open-container">Open a container</h2>
      <Cautions
        title="Before placing a waste container"
        items={[
          "Glycerol phase and methanol-rich liquid are flammable: place their containers away from ignition sources and fill them with bonded and grounded transfer.",
          "Oily or methanol-wet spent filter media can heat itself: use a closed metal bin, away from buildings.",
          "Label the container with its contents and the accumulation start as your site's procedure requires.",
        ]}
      />
      <OpenContainerForm streams={WASTE_STREAMS.map((s) => [s, labelOf(s)] as const)} nowLocal={nowLocal} />
    </section>
  );
}

function DisposalsTable({ disposals, timeZone }: { disposals: DisposalRow[]; timeZone: string }) {
  return (
    <DataTable<DisposalRow>
      caption="Waste disposals"
      hideCaption
      rows={disposals}
      rowKey={(d) => d.documentNo}
      rowId={(d) => d.documentNo}
      empty="No waste has been hauled away yet."
      columns={[
        ...haulColumns<DisposalRow>(timeZone),
        {
          key: "from",
          header: "From containers",
          cell: (d) =>
            d.containerCodes.map((c, i) => (
              <span key={c}>
                {i > 0 ? ", " : ""}
                <a href={`/waste/${encodeURIComponent(c)}`}>{c}</a>
              </span>
            )),
        },
        { key: "mass", header: "Mass", numeric: true, cell: (d) => kg(d.massG) },
        {
          key: "history",
          header: "History",
          cell: (d) => <HistoryLink kind="disposal" recordKey={d.documentNo} label="disposal" />,
        },
      ]}
    />
  );
}
