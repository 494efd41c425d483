import type {
  BalanceLine,
  BalanceReport,
  BatchRow,
  GaugeRow,
  MaterialBalanceRow,
} from "@/lib/mass-balance/balance.service";
import { kg, kgExact, num, when } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { HolderLink } from "@/app/_ui/ui";
import { ClosureChip } from "@/app/balance/closure";

const mass3 = (grams: number) => kg(grams, 3);

/** One side of the stock identity: its lines and their total. */
export function IdentityTable({
  caption,
  lines,
  totalLabel,
  totalG,
}: {
  caption: string;
  lines: readonly BalanceLine[];
  totalLabel: string;
  totalG: number;
}) {
  return (
    <DataTable
      caption={caption}
      rows={lines}
      rowKey={(l) => l.key}
      empty="Nothing in this period."
      columns={[
        { key: "line", header: "Line", cell: (l) => l.label, total: totalLabel },
        { key: "mass", header: "Mass", numeric: true, cell: (l) => kgExact(l.grams), total: kgExact(totalG) },
      ]}
    />
  );
}

export function FlowsTable({ lines }: { lines: readonly BalanceLine[] }) {
  return (
    <DataTable
      caption="Flows inside the site"
      hideCaption
      rows={lines}
      rowKey={(l) => l.key}
      empty="No flow between the site's own places in this period."
      columns={[
        { key: "flow", header: "Flow", cell: (l) => l.label },
        { key: "mass", header: "Mass in the period", numeric: true, cell: (l) => mass3(l.grams) },
      ]}
    />
  );
}

const MATERIAL_COLUMNS: ReadonlyArray<Column<MaterialBalanceRow>> = [
  { key: "material", header: "Material", cell: (m) => m.label },
  { key: "opening", header: "Opening", numeric: true, cell: (m) => mass3(m.openingG) },
  { key: "received", header: "Received", numeric: true, cell: (m) => mass3(m.receiptsG) },
  { key: "fromOther", header: "From other kinds", numeric: true, cell: (m) => mass3(m.inG - m.receiptsG) },
  { key: "out", header: "Shipped, hauled, lost", numeric: true, cell: (m) => mass3(m.outputsG) },
  { key: "toOther", header: "To other kinds", numeric: true, cell: (m) => mass3(m.transfersOutG) },
  { key: "closing", header: "Closing", numeric: true, cell: (m) => mass3(m.closingG) },
  { key: "unaccounted", header: "Unaccounted", numeric: true, cell: (m) => kgExact(m.imbalanceG) },
  { key: "books", header: "Books", cell: (m) => <ClosureChip closure={m.closure} /> },
  { key: "differences", header: "Differences", numeric: true, cell: (m) => kgExact(m.differences.totalG) },
  { key: "closure", header: "Closure", cell: (m) => <ClosureChip closure={m.differences.closure} /> },
];

export function MaterialTable({ rows }: { rows: readonly MaterialBalanceRow[] }) {
  return (
    <DataTable
      caption="By material kind"
      hideCaption
      rows={rows}
      rowKey={(m) => m.materialKind}
      empty="No material kind held or moved anything in this period."
      columns={MATERIAL_COLUMNS}
    />
  );
}

export function GaugeTable({ gauges, timeZone }: { gauges: NonNullable<BalanceReport["gauges"]>; timeZone: string }) {
  const t = gauges.total;
  const columns: Array<Column<GaugeRow>> = [
    {
      key: "tank",
      header: "Tank",
      cell: (g) => <HolderLink holder={{ kind: "TANK", code: g.tankCode }} showKind={false} />,
      total: "All gauged tanks",
    },
    { key: "at", header: "Gauged", cell: (g) => <span className="nowrap">{when(g.at, timeZone)}</span>, total: "" },
    { key: "book", header: "Book stock then", numeric: true, cell: (g) => mass3(g.bookG), total: mass3(t.bookG) },
    { key: "measured", header: "Measured", numeric: true, cell: (g) => mass3(g.measuredG), total: mass3(t.measuredG) },
    {
      key: "difference",
      header: "Measured − book",
      numeric: true,
      cell: (g) => mass3(g.differenceG),
      total: mass3(t.differenceG),
    },
    {
      key: "closure",
      header: "Closure",
      cell: (g) => <ClosureChip closure={g.closure} what="of book stock" />,
      total: <ClosureChip closure={t.closure} what="of book stock" />,
    },
  ];
  return (
    <DataTable
      caption="Gauges against the book"
      hideCaption
      rows={gauges.rows}
      rowKey={(g) => g.tankCode}
      empty="No tank was gauged before the end of this period."
      columns={columns}
    />
  );
}

export function EventTable({ events, timeZone }: { events: BalanceReport["events"]; timeZone: string }) {
  return (
    <DataTable
      caption="Closes and reopens of this period"
      rows={events}
      rowKey={(e) => e.id}
      empty="No close or reopen recorded for this period yet."
      columns={[
        { key: "when", header: "When", cell: (e) => <span className="nowrap">{when(e.at, timeZone)}</span> },
        { key: "action", header: "Action", cell: (e) => (e.action === "CLOSE" ? "Closed" : "Reopened") },
        { key: "by", header: "By", cell: (e) => e.by },
        { key: "reason", header: "Reason", cell: (e) => e.reason },
      ]}
    />
  );
}

const BATCH_COLUMNS: ReadonlyArray<Column<BatchRow>> = [
  {
    key: "batch",
    header: "Batch",
    cell: (b) => (
      <>
        <HolderLink holder={{ kind: "BATCH", code: b.code }} showKind={false} />
        {b.completedAt === null ? <span className="tag">in progress</span> : null}
      </>
    ),
  },
  { key: "charged", header: "Charged", numeric: true, cell: (b) => mass3(b.inputsG) },
  { key: "drawn", header: "Drawn off", numeric: true, cell: (b) => mass3(b.outputsG) },
  {
    key: "unmeasured",
    header: "Unmeasured difference, or still in it",
    numeric: true,
    cell: (b) => kgExact(b.imbalanceG),
  },
  {
    key: "yield",
    header: "Ester ÷ oil",
    numeric: true,
    cell: (b) => {
      const oil = b.inputsByRole.OIL ?? 0;
      return oil > 0 ? num((b.outputsByRole.ESTER ?? 0) / oil, 4) : "—";
    },
  },
  {
    key: "closure",
    header: "Closure",
    cell: (b) =>
      b.completedAt === null ? <span className="muted">not flagged</span> : <ClosureChip closure={b.closure} />,
  },
];

export function BatchTable({ rows }: { rows: BatchRow[] }) {
  return (
    <DataTable
      caption="Batches"
      hideCaption
      rows={rows}
      rowKey={(b) => b.holderId}
      empty="No batch."
      columns={BATCH_COLUMNS}
    />
  );
}
