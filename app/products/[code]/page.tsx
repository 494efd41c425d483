import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/ledger/kinds";
import { getMadeOf } from "@/lib/feedstock/lot-flow.service";
import { getProductLotDetail } from "@/lib/product/product.store";
import { kg, kgExact, litres, num, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { MadeOf } from "@/app/_ui/made-of";
import { loadSite } from "@/app/_ui/site";
import { Empty, Facts, HolderLink, NoSite, PassFail, Status } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Product lot ${codeParam((await params).code)}` };
}

function limits(min: number | null, max: number | null): string {
  if (min !== null && max !== null) return `${num(min, 3)} – ${num(max, 3)}`;
  if (min !== null) return `≥ ${num(min, 3)}`;
  if (max !== null) return `≤ ${num(max, 3)}`;
  return "report only";
}

export default async function ProductLotPage({ params }: Props) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const p = await getProductLotDetail(db, site.id, codeParam((await params).code));
  if (!p) notFound();
  const madeOf = p.incoming.length > 0 ? await getMadeOf(db, site.id, p.holderId, new Date()) : { totalG: 0, shares: [], order: "dated" as const };
  const tz = site.timeZone;
  const shipments = p.outgoing.filter((m) => m.to.kind === "SHIPMENT");
  const transfers = p.outgoing.filter((m) => m.to.kind !== "SHIPMENT");
  return (
    <>
      <p className="crumbs">
        <Link href="/products">Product lots</Link> /
      </p>
      <h1>Product lot {p.code}</h1>
      {p.status === "RELEASED" && p.stockG > 0 ? <p><Link href={`/shipments/new?from=${encodeURIComponent(p.code)}`}>Ship from this lot</Link></p> : null}
      <Facts
        items={[
          [
            "Batch",
            p.batchCode ? (
              <>
                <Link href={`/batches/${encodeURIComponent(p.batchCode)}`}>{p.batchCode}</Link>{" "}
                {p.batchStatus ? <span className="muted">({labelOf(p.batchStatus).toLowerCase()})</span> : null}
              </>
            ) : (
              "—"
            ),
          ],
          ["Produced", when(p.producedAt, tz)],
          ["Mass made", kg(p.massG, 3)],
          ["Book stock", kg(p.stockG, 3)],
          ["Release status", <Status key="s" code={p.status} />],
          ["Released", when(p.releasedAt, tz)],
          ["QC results", p.qcCount === 0 ? "none yet" : p.qcFailed > 0 ? `${p.qcFailed} of ${p.qcCount} out of limits` : `all ${p.qcCount} within limits`],
        ]}
      />

      <h2>Quality control</h2>
      {p.qc.length === 0 ? (
        <Empty>No QC results recorded yet; the lot stays on hold until they are.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Property</th>
                <th scope="col">Method</th>
                <th scope="col" className="num">
                  Result
                </th>
                <th scope="col">Unit</th>
                <th scope="col" className="num">
                  Limits
                </th>
                <th scope="col">Specification</th>
                <th scope="col">Tested</th>
                <th scope="col">Verdict</th>
              </tr>
            </thead>
            <tbody>
              {p.qc.map((q) => (
                <tr key={q.id}>
                  <td>{q.property.replace(/_/g, " ").toLowerCase()}</td>
                  <td>{q.method}</td>
                  <td className="num">{num(q.value, 4).replace(/\.?0+$/, "") || "0"}</td>
                  <td>{q.unit}</td>
                  <td className="num">{limits(q.limitMin, q.limitMax)}</td>
                  <td>{q.specRef}</td>
                  <td className="nowrap">{when(q.testedAt, tz)}</td>
                  <td>
                    <PassFail pass={q.pass} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      <h2>Shipments</h2>
      {shipments.length === 0 ? (
        <Empty>Nothing has been shipped from this lot directly.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Shipment</th>
                <th scope="col">Shipped</th>
                <th scope="col" className="num">
                  Mass
                </th>
                <th scope="col" className="num">
                  Volume
                </th>
              </tr>
            </thead>
            <tbody>
              {shipments.map((m) => (
                <tr key={m.id}>
                  <td>
                    <HolderLink holder={m.to} showKind={false} />
                  </td>
                  <td className="nowrap">{when(m.at, tz)}</td>
                  <td className="num">{kgExact(m.massG)}</td>
                  <td className="num">{m.volumeMl === null ? "—" : litres(m.volumeMl)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {transfers.length > 0 ? (
        <>
          <h2>Moved to storage</h2>
          <div className="table-wrap">
            <table>
              <thead>
                <tr>
                  <th scope="col">To</th>
                  <th scope="col">When</th>
                  <th scope="col" className="num">
                    Mass
                  </th>
                </tr>
              </thead>
              <tbody>
                {transfers.map((m) => (
                  <tr key={m.id}>
                    <td>
                      <HolderLink holder={m.to} />
                    </td>
                    <td className="nowrap">{when(m.at, tz)}</td>
                    <td className="num">{kgExact(m.massG)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      ) : null}

      <h2>Feedstock and reagent lots in this product lot</h2>
      <MadeOf madeOf={madeOf} what="product lot" />
    </>
  );
}
