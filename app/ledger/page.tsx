import type { Metadata } from "next";
import { labelOf } from "@/lib/ledger/kinds";
import { listMovementPage } from "@/lib/ledger/movement.store";
import { kgExact, litres, num, when } from "@/app/_ui/format";
import { PAGE_SIZE, pageParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { Empty, HolderLink, NoSite, Note, Pager } from "@/app/_ui/ui";
import { ReverseMovementForm } from "@/app/corrections/correction-forms";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Ledger" };

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
      <p className="lede">Every movement of material between places, newest first, in grams. Rows are never changed or deleted; a mistake is corrected by a reversing movement.</p>
      {total === 0 ? (
        <Empty>No movements recorded yet.</Empty>
      ) : (
        <>
          <Pager basePath="/ledger" page={page} total={total} pageSize={PAGE_SIZE} />
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col" className="num">
                    No.
                  </th>
                  <th scope="col">When</th>
                  <th scope="col">Role</th>
                  <th scope="col">From</th>
                  <th scope="col">To</th>
                  <th scope="col" className="num">
                    Mass
                  </th>
                  <th scope="col" className="num">
                    Volume
                  </th>
                  <th scope="col" className="num">
                    Temp.
                  </th>
                  <th scope="col">Recorded by</th>
                  <th scope="col">Note</th>
                  {canCorrect ? <th scope="col">Correct</th> : null}
                </tr>
              </thead>
              <tbody>
                {rows.map((m) => (
                  <tr key={m.id}>
                    <td className="num">{m.id}</td>
                    <td className="nowrap">{when(m.at, tz)}</td>
                    <td>{labelOf(m.role)}</td>
                    <td>
                      <HolderLink holder={m.from} />
                    </td>
                    <td>
                      <HolderLink holder={m.to} />
                    </td>
                    <td className="num">{kgExact(m.massG)}</td>
                    <td className="num">{m.volumeMl === null ? "—" : litres(m.volumeMl)}</td>
                    <td className="num">{m.tempC === null ? "—" : `${num(m.tempC, 1)} °C`}</td>
                    <td>{m.recordedBy}</td>
                    <td>
                      {m.note}
                      {m.reversesId !== null ? <span className="tag">reverses No. {m.reversesId}</span> : null}
                      {m.reversedById !== null ? <span className="tag">reversed by No. {m.reversedById}</span> : null}
                    </td>
                    {canCorrect ? (
                      <td>{m.role === "TRANSFER" && m.from !== null && m.to.kind === "TANK" && m.reversesId === null && m.reversedById === null ? <ReverseMovementForm movementId={m.id} /> : null}</td>
                    ) : null}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Pager basePath="/ledger" page={page} total={total} pageSize={PAGE_SIZE} />
          <Note>&ldquo;Outside the books&rdquo; marks material entering the books: a pickup, a delivery, a reagent received, or a receiving difference.</Note>
        </>
      )}
    </>
  );
}
