import type { Metadata } from "next";
import Link from "next/link";
import { TraceThis } from "@/app/_ui/trace-this";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import { getLotDetail } from "@/lib/feedstock/lot-detail.store";
import { getLotFlow } from "@/lib/feedstock/lot-flow.service";
import type { LotFlow } from "@/lib/feedstock/lot-detail.store";
import { kg, kgExact, litres, num, pct, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { MoveLotSection } from "@/app/lots/[code]/move-lot";
import { CodeLink, Empty, Facts, HolderLink, NoSite, Note, Status } from "@/app/_ui/ui";
import { ReportLinks } from "@/app/_ui/report-view";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Lot ${codeParam((await params).code)}` };
}

export default async function LotPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const lot = await getLotDetail(db, site.id, codeParam((await params).code));
  if (!lot) notFound();
  const flow = await getLotFlow(db, site.id, lot.holderId, new Date());
  const tz = site.timeZone;
  const ffa = lot.titrations.filter((t) => !t.voided);
  return (
    <>
      <p className="crumbs">
        <Link href="/lots">Lots</Link> /
      </p>
      <h1>Lot {lot.code}</h1>
      <Facts
        items={[
          ["Material", labelOf(lot.material)],
          ["Status", <Status key="s" code={lot.status} />],
          ["Received", when(lot.receivedAt, tz)],
          [
            "Came from",
            lot.origin === "DELIVERY" ? (
              <>
                Delivery {lot.deliveryDocument ?? ""} from{" "}
                {lot.supplier ? (
                  <Link href={`/sources/${encodeURIComponent(lot.supplier.code)}`}>{lot.supplier.name}</Link>
                ) : (
                  "a supplier"
                )}
              </>
            ) : (
              `${lot.pickups.length} pickup${lot.pickups.length === 1 ? "" : "s"}`
            ),
          ],
          ["Certified material", lot.certified ? "Yes" : "No"],
          ["Mass received", kg(lot.massG, 3)],
          ["Book stock now", kg(lot.stockG, 3)],
          [
            "FFA (mean of titrations)",
            ffa.length ? pct(ffa.reduce((s, t) => s + t.ffaPct, 0) / ffa.length) : "not titrated yet",
          ],
        ]}
      />
      {lot.notes ? <p>Notes: {lot.notes}</p> : null}
      <TraceThis kind="LOT" code={lot.code} role={user.role} />
      <ReportLinks
        base={`/lots/${encodeURIComponent(lot.code)}/report`}
        pdfLabel="Lot history"
        tables={[
          ["pickups", "Pickups"],
          ["lab", "Lab results"],
          ["where-it-went", "Where it went"],
        ]}
      />
      <p>
        <Link href={`/lab/${encodeURIComponent(lot.code)}`}>
          {lot.status === "QUARANTINED" ? "Record lab results and decide" : "Lab results"}
        </Link>
      </p>

      <MoveLotSection db={db} site={site} user={user} lot={lot} />

      <h2>Measurement and density basis</h2>
      <Facts
        items={[
          ["Observed volume", `${litres(lot.observedVolumeMl)} at ${num(lot.observedTempC, 1)} °C`],
          ["Density", `${num(lot.densityKgM3, 1)} kg/m³ at ${num(lot.referenceTempC, 1)} °C`],
          ["Standard volume", `${litres(lot.standardVolumeMl)} at ${num(lot.referenceTempC, 1)} °C`],
          ["Mass", `${kg(lot.massG, 3)} (standard volume × density)`],
        ]}
      />
      <Note>Density from: {lot.densitySource}</Note>

      <h2>Titrations</h2>
      {lot.titrations.length === 0 ? (
        <Empty>No titrations recorded yet.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Tested</th>
                <th scope="col">Analyst</th>
                <th scope="col" className="num">
                  Sample
                </th>
                <th scope="col">Titrant</th>
                <th scope="col" className="num">
                  Strength
                </th>
                <th scope="col" className="num">
                  Titre
                </th>
                <th scope="col" className="num">
                  Blank
                </th>
                <th scope="col">FFA as</th>
                <th scope="col" className="num">
                  FFA
                </th>
                <th scope="col" className="num">
                  Acid value
                </th>
                <th scope="col">State</th>
              </tr>
            </thead>
            <tbody>
              {lot.titrations.map((t) => (
                <tr key={t.id}>
                  <td className="nowrap">{when(t.testedAt, tz)}</td>
                  <td>{t.analyst}</td>
                  <td className="num">{num(t.sampleMassG, 3)} g</td>
                  <td>{labelOf(t.titrant)}</td>
                  <td className="num">{num(t.concentrationMolL, 4)} mol/L</td>
                  <td className="num">{num(t.titreMl, 2)} mL</td>
                  <td className="num">{num(t.blankMl, 2)} mL</td>
                  <td>{t.basis.charAt(0) + t.basis.slice(1).toLowerCase()} acid</td>
                  <td className="num">{pct(t.ffaPct)}</td>
                  <td className="num">{num(t.acidValue, 2)} mg KOH/g</td>
                  <td>{t.voided ? <span className="status status-void">Voided</span> : "Valid"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      <h2>Other lab tests</h2>
      {lot.labTests.length === 0 ? (
        <Empty>No other lab tests recorded yet.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Tested</th>
                <th scope="col">Test</th>
                <th scope="col">Method</th>
                <th scope="col">Analyst</th>
                <th scope="col" className="num">
                  Result
                </th>
                <th scope="col">State</th>
              </tr>
            </thead>
            <tbody>
              {lot.labTests.map((t) => (
                <tr key={t.id}>
                  <td className="nowrap">{when(t.testedAt, tz)}</td>
                  <td>{t.kind.charAt(0) + t.kind.slice(1).toLowerCase()}</td>
                  <td>{t.method}</td>
                  <td>{t.analyst}</td>
                  <td className="num">{pct(t.valuePct)}</td>
                  <td>{t.voided ? <span className="status status-void">Voided</span> : "Valid"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      {lot.origin === "PICKUPS" ? (
        <>
          <h2>Pickups in this lot</h2>
          {lot.pickups.length === 0 ? (
            <Empty>No pickups are linked to this lot.</Empty>
          ) : (
            <div className="table-wrap">
              <table>
                <thead>
                  <tr>
                    <th scope="col">Pickup</th>
                    <th scope="col">Observed</th>
                    <th scope="col">Source</th>
                    <th scope="col" className="num">
                      Volume
                    </th>
                    <th scope="col" className="num">
                      Estimated mass
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {lot.pickups.map((p) => (
                    <tr key={p.code}>
                      <td>
                        <CodeLink href={`/pickups/${encodeURIComponent(p.code)}`} code={p.code} />
                      </td>
                      <td className="nowrap">{when(p.observedAt, tz)}</td>
                      <td>
                        <Link href={`/sources/${encodeURIComponent(p.sourceCode)}`}>{p.sourceCode}</Link>{" "}
                        <span className="muted">{p.sourceName}</span>
                      </td>
                      <td className="num">{litres(p.volumeMl)}</td>
                      <td className="num">{kg(p.massG)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </>
      ) : null}

      <WhereItWent flow={flow} lotCode={lot.code} timeZone={tz} />
    </>
  );
}

/** Grams of the lot held anywhere now, by kind of place; with what is left in the lot it adds up to what entered. */
function WhereItIsNow({ flow, lotCode }: { flow: LotFlow; lotCode: string }) {
  const byKind = new Map<string, { places: number; heldG: number }>();
  for (const d of flow.destinations) {
    if (d.heldG === null || d.heldG === 0) continue;
    const k = byKind.get(d.holder.kind) ?? { places: 0, heldG: 0 };
    k.places += 1;
    k.heldG += d.heldG;
    byKind.set(d.holder.kind, k);
  }
  const rows = [...byKind].sort((a, b) => b[1].heldG - a[1].heldG);
  const total = rows.reduce((s, [, k]) => s + k.heldG, flow.stillInLotG);
  return (
    <>
      <h3>Where it is now</h3>
      <div className="table-wrap">
        <table>
          <thead>
            <tr>
              <th scope="col">Kind of place</th>
              <th scope="col" className="num">
                Places
              </th>
              <th scope="col" className="num">
                Of this lot
              </th>
            </tr>
          </thead>
          <tbody>
            <tr>
              <td>Still in lot {lotCode}</td>
              <td className="num">1</td>
              <td className="num">{kg(flow.stillInLotG)}</td>
            </tr>
            {rows.map(([kind, k]) => (
              <tr key={kind}>
                <td>{labelOf(kind)}</td>
                <td className="num">{k.places}</td>
                <td className="num">{kg(k.heldG)}</td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr>
              <td>Total</td>
              <td />
              <td className="num">{kg(total)}</td>
            </tr>
          </tfoot>
        </table>
      </div>
    </>
  );
}

/** A time-ordered flow through a pooled tank reaches everything drawn from it later; show the first rows only. */
const MAX_PLACES = 60;

function WhereItWent({ flow, lotCode, timeZone }: { flow: LotFlow; lotCode: string; timeZone: string }) {
  const traced = flow.method !== "time-ordered";
  const places = flow.destinations.slice(0, MAX_PLACES);
  const moves = flow.moves;
  return (
    <section aria-labelledby="went-h">
      <h2 id="went-h">{traced ? "Where it went" : "Where it went: possible destinations (time-ordered flow)"}</h2>
      {traced ? (
        <Note>
          Kilograms of this lot&apos;s material reaching each place, found by replaying the movement ledger: a tank
          mixes what it holds (or hands it on first in, first out where so set), so a batch drawn from a tank carries
          its share of every lot in it, and a batch&apos;s outputs carry the batch&apos;s shares.
          {flow.reversedPairsLeftOut > 0
            ? ` ${flow.reversedPairsLeftOut} reversed movements (booking corrections) are left out.`
            : ""}
        </Note>
      ) : (
        <p className="warning">
          The ledger could not be replayed ({flow.traceProblem}). Listed instead: every movement out of a place after
          material from this lot first arrived there. It may over-state where the lot went; masses are whole movements,
          not this lot&apos;s share.
        </p>
      )}
      {flow.method === "booking-order" ? (
        <p className="warning">
          Replayed in the order the movements were booked, not by their dates: by date, the books do not balance (
          {flow.traceProblem}). Book stock was checked in booking order, so this order gives consistent shares; the
          dates shown are the movements&apos; own.
        </p>
      ) : null}
      <p>
        Entered lot {lotCode}: <strong>{kg(flow.enteredG)}</strong>. Still in the lot:{" "}
        <strong>{kg(flow.stillInLotG)}</strong>.
      </p>
      {flow.destinations.length === 0 ? (
        <Empty>Nothing has left this lot yet.</Empty>
      ) : (
        <>
          {traced ? <WhereItIsNow flow={flow} lotCode={lotCode} /> : null}
          <h3>Places reached, in time order</h3>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">Place</th>
                  <th scope="col">First reached</th>
                  <th scope="col" className="num">
                    {traced ? "Received from this lot" : "Moved in (whole movements)"}
                  </th>
                  {traced ? (
                    <th scope="col" className="num">
                      Still there
                    </th>
                  ) : null}
                </tr>
              </thead>
              <tbody>
                {places.map((d) => (
                  <tr key={d.holder.id}>
                    <td>
                      <HolderLink holder={d.holder} />
                    </td>
                    <td className="nowrap">{when(d.firstAt, timeZone)}</td>
                    <td className="num">{kg(d.receivedG)}</td>
                    {traced ? <td className="num">{d.heldG === null ? "—" : kg(d.heldG)}</td> : null}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {places.length < flow.destinations.length ? (
            <Note>
              The first {places.length} of {flow.destinations.length} places are shown.
            </Note>
          ) : null}
          <h3>Movements that carried it</h3>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">When</th>
                  <th scope="col">Role</th>
                  <th scope="col">From</th>
                  <th scope="col">To</th>
                  <th scope="col" className="num">
                    {traced ? "Of this lot" : "Mass"}
                  </th>
                  {traced ? (
                    <th scope="col" className="num">
                      Whole movement
                    </th>
                  ) : null}
                </tr>
              </thead>
              <tbody>
                {moves.map((m) => (
                  <tr key={m.id}>
                    <td className="nowrap">{when(m.at, timeZone)}</td>
                    <td>{labelOf(m.role)}</td>
                    <td>
                      <HolderLink holder={m.from} />
                    </td>
                    <td>
                      <HolderLink holder={m.to} />
                    </td>
                    <td className="num">{kgExact(m.grams)}</td>
                    {traced ? <td className="num">{kgExact(m.moveMassG)}</td> : null}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {moves.length < flow.movesTotal ? (
            <Note>
              The first {moves.length} of {flow.movesTotal} movements are shown; the <Link href="/ledger">ledger</Link>{" "}
              has them all.
            </Note>
          ) : null}
        </>
      )}
    </section>
  );
}
