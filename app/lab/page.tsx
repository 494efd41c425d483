import type { Metadata } from "next";
import { labelOf } from "@/lib/ledger/kinds";
import { listLots } from "@/lib/feedstock/lot.store";
import { daysBetween, ffa, kg, pct, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, NoSite, Note } from "@/app/_ui/ui";
import { LabCautions } from "@/app/lab/lab-cautions";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Lab" };

export default async function LabPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const { rows, total } = await listLots(db, site.id, { status: "QUARANTINED", take: 200 });
  const tz = site.timeZone;
  const now = user.now;
  return (
    <>
      <h1>Lab</h1>
      <p className="lede">
        Lots waiting for the lab. Titrate for free fatty acids, test the water, then accept the lot for production or reject it. A lot can only be accepted once it
        has an FFA titration.
      </p>
      {user.role !== "PRODUCTION" ? <Note>Production staff record lab results; you can read them.</Note> : null}
      <LabCautions kind="titration" />
      {total === 0 ? (
        <Empty>No lot is waiting for the lab.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <caption>{total === 1 ? "1 lot awaiting the lab" : `${total} lots awaiting the lab`}</caption>
            <thead>
              <tr>
                <th scope="col">Lot</th>
                <th scope="col">Material</th>
                <th scope="col">Received</th>
                <th scope="col" className="num">Waiting</th>
                <th scope="col" className="num">Mass</th>
                <th scope="col" className="num">FFA so far</th>
                <th scope="col" className="num">Water so far</th>
                <th scope="col">Source</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((l) => (
                <tr key={l.code}>
                  <td>
                    <CodeLink href={`/lab/${encodeURIComponent(l.code)}`} code={l.code} />
                  </td>
                  <td>{labelOf(l.material)}</td>
                  <td className="nowrap">{when(l.receivedAt, tz)}</td>
                  <td className="num">{Math.max(0, daysBetween(l.receivedAt, now))} d</td>
                  <td className="num">{kg(l.massG)}</td>
                  <td className="num">{ffa(l.ffaPct, l.ffaBasis)}</td>
                  <td className="num">{l.waterPct === null ? "—" : pct(l.waterPct)}</td>
                  <td>{l.supplier ?? `${l.pickups} pickup${l.pickups === 1 ? "" : "s"}`}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
