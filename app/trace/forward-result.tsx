import { labelOf } from "@/lib/core/vocabulary";
import type { ForwardHolderRow, ForwardTraceReport } from "@/lib/trace/trace.service";
import { kg, kgExact, pct, when } from "@/app/_ui/format";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { Empty, Facts, HolderLink, Note } from "@/app/_ui/ui";
import { CustomerName, CustomerShares } from "@/app/trace/customer-shares";
import { FreshnessNote } from "@/app/trace/trace-tables";
import { TraceGraphView } from "@/app/trace/trace-graph";
import { csvHref, EpcisLink } from "@/app/trace/trace-links";

type StageRow = ForwardTraceReport["heldByStage"][number];

function HeldByStageTable({ r, heldTotal }: { r: ForwardTraceReport; heldTotal: number }) {
  const share = (g: number) => pct((g * 100) / r.enteredG, 2);
  const columns: Array<Column<StageRow>> = [
    { key: "stage", header: "Stage", cell: (s) => s.label, total: "Total (equals what entered)" },
    { key: "places", header: "Places", numeric: true, cell: (s) => s.holders, total: "" },
    { key: "held", header: "Held there", numeric: true, cell: (s) => kg(s.grams, 3), total: kg(heldTotal, 3) },
    { key: "share", header: "Share", numeric: true, cell: (s) => share(s.grams), total: share(heldTotal) },
  ];
  return (
    <DataTable
      caption="Where it is now"
      hideCaption
      rows={r.heldByStage}
      rowKey={(s) => s.label}
      empty="Nothing of it is held anywhere."
      columns={columns}
    />
  );
}

function ReachedTable({ rows, csv, timeZone }: { rows: readonly ForwardHolderRow[]; csv: string; timeZone: string }) {
  const columns: Array<Column<ForwardHolderRow>> = [
    { key: "stage", header: "Stage", cell: (h) => h.stageLabel },
    {
      key: "place",
      header: "Place",
      cell: (h) => (
        <>
          <HolderLink holder={h.holder} />
          {h.customer ? (
            <>
              {" "}
              to <CustomerName customer={h.customer} />
            </>
          ) : null}
        </>
      ),
    },
    { key: "first", header: "First reached", cell: (h) => <span className="nowrap">{when(h.firstAt, timeZone)}</span> },
    { key: "received", header: "Received of it", numeric: true, cell: (h) => kg(h.receivedG, 3) },
    {
      key: "held",
      header: "Still held",
      numeric: true,
      cell: (h) => (h.heldG === 0 ? <span className="muted">0</span> : kg(h.heldG, 3)),
    },
  ];
  return (
    <DataTable
      caption={`${rows.length} places after the pickups`}
      rows={rows}
      rowKey={(h) => h.holder.id}
      empty="It reached no place after the pickups."
      csvHref={csv}
      columns={columns}
    />
  );
}

export function ForwardResult({ r, timeZone }: { r: ForwardTraceReport; timeZone: string }) {
  const csv = csvHref({ dir: "fwd", kind: r.query.kind, code: r.query.code, table: "holders" });
  const downstream = r.holders.filter((h) => h.holder.kind !== "PICKUP");
  const pickups = r.holders.filter((h) => h.holder.kind === "PICKUP");
  const heldTotal = r.heldByStage.reduce((s, x) => s + x.grams, 0);
  const subjectWord = r.subject.kind === "SOURCE" ? "source" : labelOf(r.subject.kind).toLowerCase();
  return (
    <section aria-labelledby="fwd-h" className="trace-result">
      <h2 id="fwd-h">
        Where {subjectWord} {r.subject.code} went
      </h2>
      <Facts
        items={[
          ["Followed", r.subject.label],
          ["Entered the books", <strong key="e">{kgExact(r.enteredG)}</strong>],
          ["Origins followed", String(r.origins)],
          ["Movements that carried part of it", String(r.movesCarried)],
          ["Last movement included", r.asOf ? `no. ${r.asOf.moveId}, ${when(r.asOf.at, timeZone)}` : "none"],
        ]}
      />
      <Note>
        Every place that received part of this material and how much of it is still there, by replaying the ledger
        forward. Recovered methanol carries its share of a batch into the methanol tank and on into later batches, so
        later batches can hold a little of it.
      </Note>
      <FreshnessNote f={r.freshness} />
      <EpcisLink params={{ dir: "fwd", kind: r.query.kind, code: r.query.code }} />
      {r.enteredG === 0 ? (
        <Empty>No material of this {subjectWord} has entered the books.</Empty>
      ) : (
        <>
          <h3>Where it is now</h3>
          <HeldByStageTable r={r} heldTotal={heldTotal} />
          <CustomerShares rows={r.byCustomer} enteredG={r.enteredG} />
          <h3>Graph</h3>
          {r.graph ? (
            <>
              <TraceGraphView
                graph={r.graph}
                title={`Where the material of ${subjectWord} ${r.subject.code} went, by stage`}
              />
              <Note>{r.graph.note} Small boxes are folded into &quot;others&quot; per stage.</Note>
            </>
          ) : null}
          <h3>Every place it reached</h3>
          <ReachedTable rows={downstream} csv={csv} timeZone={timeZone} />
          {pickups.length > 0 ? (
            <details className="more-rows">
              <summary>{pickups.length} pickups</summary>
              <ul className="code-list">
                {pickups.map((p) => (
                  <li key={p.holder.id}>
                    <HolderLink holder={p.holder} showKind={false} /> {kg(p.receivedG, 1)}
                  </li>
                ))}
              </ul>
            </details>
          ) : null}
        </>
      )}
    </section>
  );
}
