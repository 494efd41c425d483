import Link from "next/link";
import type { FeedstockShare, MadeOf as MadeOfTrace } from "@/lib/feedstock/lot-detail.store";
import { kg, pct } from "@/app/_ui/format";
import { labelOf } from "@/lib/core/vocabulary";
import { DataTable } from "@/app/_ui/kit/data-table";
import type { Column } from "@/app/_ui/kit/data-table";
import { Empty, Note } from "@/app/_ui/ui";

const shareKey = (s: FeedstockShare) => `${s.kind}:${s.code}`;

function feedstockColumns(madeOf: MadeOfTrace): Array<Column<FeedstockShare>> {
  return [
    {
      key: "from",
      header: "Came from",
      total: "Feedstock",
      cell: (s) =>
        s.kind === "LOT" ? (
          <>
            <span className="holder-kind">Feedstock lot</span>{" "}
            <Link href={`/lots/${encodeURIComponent(s.code)}`}>{s.code}</Link>
          </>
        ) : (
          <>
            <span className="holder-kind">Other</span> {s.code}
          </>
        ),
    },
    { key: "mass", header: "Mass", numeric: true, cell: (s) => kg(s.grams), total: kg(madeOf.feedstockG) },
    {
      key: "share",
      header: "Share of the feedstock",
      numeric: true,
      cell: (s) => pct(s.pct, 1),
      total: madeOf.shares.length > 0 ? "100 %" : "—",
    },
  ];
}

const REAGENT_COLUMNS: Array<Column<FeedstockShare>> = [
  { key: "lot", header: "Reagent lot", cell: (s) => s.code },
  { key: "reagent", header: "Reagent", cell: (s) => (s.reagent ? labelOf(s.reagent) : "—") },
  { key: "mass", header: "Mass by the mixing rules", numeric: true, cell: (s) => kg(s.grams) },
];

/** Backward trace of a batch or product lot: the feedstock lots with their shares, the reagents apart. */
export function MadeOf({ madeOf, what }: { madeOf: MadeOfTrace | null; what: string }) {
  if (madeOf === null)
    return (
      <p className="warning">The ledger could not be replayed, so the lots in this {what} cannot be worked out.</p>
    );
  if (madeOf.shares.length === 0 && madeOf.reagents.length === 0)
    return <Empty>Nothing has gone into this {what} yet.</Empty>;
  return (
    <>
      <DataTable
        caption="Feedstock"
        columns={feedstockColumns(madeOf)}
        rows={madeOf.shares}
        rowKey={shareKey}
        empty="No feedstock has gone in, only reagents."
      />
      {madeOf.reagents.length > 0 ? (
        <DataTable
          caption={`Reagents (not ingredients: no share of the ${what})`}
          columns={REAGENT_COLUMNS}
          rows={madeOf.reagents}
          rowKey={shareKey}
          empty=""
        />
      ) : null}
      <Note>
        Feedstock shares come from replaying the ledger under each tank&apos;s mixing model and add up to 100 % of the
        feedstock. Methanol and catalyst take part in the reaction and are listed apart; water used for washing goes to
        the wash-water stream and is never part of a product.
        {madeOf.order === "booked"
          ? " Some movements are dated before the stock they draw was booked, so the ledger is replayed in the order movements were booked rather than by date."
          : ""}
      </Note>
    </>
  );
}
