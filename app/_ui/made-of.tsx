import Link from "next/link";
import type { MadeOf as MadeOfTrace } from "@/lib/feedstock/lot-detail.store";
import { kg, pct } from "@/app/_ui/format";
import { labelOf } from "@/lib/core/vocabulary";
import { Empty, Note } from "@/app/_ui/ui";

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
      <div className="table-wrap">
        <table>
          <caption>Feedstock</caption>
          <thead>
            <tr>
              <th scope="col">Came from</th>
              <th scope="col" className="num">
                Mass
              </th>
              <th scope="col" className="num">
                Share of the feedstock
              </th>
            </tr>
          </thead>
          <tbody>
            {madeOf.shares.map((s) => (
              <tr key={`${s.kind}:${s.code}`}>
                <td>
                  {s.kind === "LOT" ? (
                    <>
                      <span className="holder-kind">Feedstock lot</span>{" "}
                      <Link href={`/lots/${encodeURIComponent(s.code)}`}>{s.code}</Link>
                    </>
                  ) : (
                    <>
                      <span className="holder-kind">Other</span> {s.code}
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
              <td>Feedstock</td>
              <td className="num">{kg(madeOf.feedstockG)}</td>
              <td className="num">{madeOf.shares.length > 0 ? "100 %" : "—"}</td>
            </tr>
          </tfoot>
        </table>
      </div>
      {madeOf.reagents.length > 0 ? (
        <div className="table-wrap">
          <table>
            <caption>Reagents (not ingredients: no share of the {what})</caption>
            <thead>
              <tr>
                <th scope="col">Reagent lot</th>
                <th scope="col">Reagent</th>
                <th scope="col" className="num">
                  Mass by the mixing rules
                </th>
              </tr>
            </thead>
            <tbody>
              {madeOf.reagents.map((s) => (
                <tr key={`${s.kind}:${s.code}`}>
                  <td>{s.code}</td>
                  <td>{s.reagent ? labelOf(s.reagent) : "—"}</td>
                  <td className="num">{kg(s.grams)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
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
