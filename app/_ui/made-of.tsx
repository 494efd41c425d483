import Link from "next/link";
import type { MadeOf as MadeOfTrace } from "@/lib/feedstock/lot-detail.store";
import { kg, pct } from "@/app/_ui/format";
import { Empty, Note } from "@/app/_ui/ui";

/** Backward trace of a batch or product lot, grouped by feedstock lot and reagent lot. */
export function MadeOf({ madeOf, what }: { madeOf: MadeOfTrace | null; what: string }) {
  if (madeOf === null) return <p className="warning">The ledger could not be replayed, so the lots in this {what} cannot be worked out.</p>;
  if (madeOf.shares.length === 0) return <Empty>Nothing has gone into this {what} yet.</Empty>;
  return (
    <>
      <div className="table-wrap">
        <table>
          <thead>
            <tr>
              <th scope="col">Came from</th>
              <th scope="col" className="num">
                Mass
              </th>
              <th scope="col" className="num">
                Share
              </th>
            </tr>
          </thead>
          <tbody>
            {madeOf.shares.map((s) => (
              <tr key={`${s.kind}:${s.code}`}>
                <td>
                  {s.kind === "LOT" ? (
                    <>
                      <span className="holder-kind">Feedstock lot</span> <Link href={`/lots/${encodeURIComponent(s.code)}`}>{s.code}</Link>
                    </>
                  ) : (
                    <>
                      <span className="holder-kind">{s.kind === "REAGENT_LOT" ? "Reagent lot" : "Other"}</span> {s.code}
                    </>
                  )}
                </td>
                <td className="num">{kg(s.grams)}</td>
                <td className="num">{pct(s.pct, 1)}</td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr>
              <td>Total</td>
              <td className="num">{kg(madeOf.totalG)}</td>
              <td className="num">100 %</td>
            </tr>
          </tfoot>
        </table>
      </div>
      <Note>
        Shares come from replaying the ledger under each tank&apos;s mixing model; the grams add up exactly to the total.
        {madeOf.order === "booked"
          ? " Some movements are dated before the stock they draw was booked, so the ledger is replayed in the order movements were booked rather than by date."
          : ""}
      </Note>
    </>
  );
}
