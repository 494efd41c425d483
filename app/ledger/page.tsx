import type { Metadata } from "next";
import { labelOf } from "@/lib/core/vocabulary";
import { listMovementPage } from "@/lib/ledger/movement.store";
import { kgExact, litres, num, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { Empty, HolderLink, NoSite, Note, Pager } from "@/app/_ui/ui";
import { ReverseMovementForm } from "@/app/corrections/correction-forms";
import type { Column } from "@/app/_ui/kit";
import { DataTable } from "@/app/_ui/kit";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Ledger" };

type MovementRow = Awaited<ReturnType<typeof listMovementPage>>["rows"][number];

function movementColumns(tz: string, canCorrect: boolean): Column<MovementRow>[] {
  const columns: Column<MovementRow>[] = [
    { key: "no", header: "No.", numeric: true, cell: (m) => m.id },
    { key: "when", header: "When", cell: (m) => <span className="nowrap">{when(m.at, tz)}</span> },
    { key: "role", header: "Role", cell: (m) => labelOf(m.role) },
    { key: "from", header: "From", cell: (m) => <HolderLink holder={m.from} /> },
    { key: "to", header: "To", cell: (m) => <HolderLink holder={m.to} /> },
    { key: "mass", header: "Mass", numeric: true, cell: (m) => kgExact(m.massG) },
    { key: "volume", header: "Volume", numeric: true, cell: (m) => (m.volumeMl === null ? "—" : litres(m.volumeMl)) },
    { key: "temp", header: "Temp.", numeric: true, cell: (m) => (m.tempC === null ? "—" : `${num(m.tempC, 1)} °C`) },
    { key: "by", header: "Recorded by", cell: (m) => m.recordedBy },
    {
      key: "note",
      header: "Note",
      cell: (m) => (
        <>
          {m.note}
          {m.reversesId !== null ? <span className="tag">reverses No. {m.reversesId}</span> : null}
          {m.reversedById !== null ? <span className="tag">reversed by No. {m.reversedById}</span> : null}
        </>
      ),
    },
  ];
  if (!canCorrect) return columns;
  const reversible = (m: MovementRow) =>
    m.role === "TRANSFER" &&
    m.from !== null &&
    m.to.kind === "TANK" &&
    m.reversesId === null &&
    m.reversedById === null;
  return [
    ...columns,
    {
      key: "correct",
      header: "Correct",
      cell: (m) => (reversible(m) ? <ReverseMovementForm movementId={m.id} /> : null),
    },
  ];
}

export default async function LedgerPage({ searchParams }: { searchParams: Promise<{ page?: string | string[] }> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const page = pageParam((await searchParams).page);
  const { rows, total } = await listMovementPage(db, site.id, { skip: (page - 1) * PAGE_SIZE, take: PAGE_SIZE });
  const tz = site.timeZone;
  const canCorrect = user.role === "PRODUCTION";
  return (
    <>
      <h1>Ledger</h1>
      <p className="lede">
        Every movement of material between places, newest first, in grams. Rows are never changed or deleted; a mistake
        is corrected by a reversing movement.
      </p>
      {total === 0 ? (
        <Empty>No movements recorded yet.</Empty>
      ) : (
        <>
          <Pager basePath="/ledger" page={page} total={total} pageSize={PAGE_SIZE} />
          <DataTable
            caption="Movements"
            hideCaption
            columns={movementColumns(tz, canCorrect)}
            rows={rows}
            rowKey={(m) => m.id}
            empty="No movements recorded yet."
          />
          <Pager basePath="/ledger" page={page} total={total} pageSize={PAGE_SIZE} />
          <Note>
            &ldquo;Outside the books&rdquo; marks material entering the books: a pickup, a delivery, a reagent received,
            or a receiving difference.
          </Note>
        </>
      )}
    </>
  );
}
