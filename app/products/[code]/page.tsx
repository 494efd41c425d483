import type { Metadata } from "next";
import Link from "next/link";
import { TraceThis } from "@/app/_ui/trace-this";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import type { SiteRole } from "@/lib/core/vocabulary";
import { getMadeOf } from "@/lib/feedstock/lot-flow.service";
import { loadProductLotQc } from "@/lib/product/certificate.service";
import { listSpecChoices } from "@/lib/spec/site-spec.service";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { kg, kgExact, litres, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { MadeOf } from "@/app/_ui/made-of";
import { loadSite } from "@/app/_ui/site";
import { Empty, HistoryLink, HolderLink, NoSite } from "@/app/_ui/ui";
import { DataTable, RecordHeader } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import type { MovementView } from "@/lib/ledger/movement.store";
import {
  DecisionForm,
  QcEntryForm,
  ReleaseCheck,
  ResultHistory,
  SpecChoiceForm,
  SpecResults,
} from "@/app/products/[code]/qc-sections";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Product lot ${codeParam((await params).code)}` };
}

/** "2026-12-04T10:15" in the site's zone, for a datetime-local default. */
function localNow(now: Date, timeZone: string): string {
  return new Date(now.getTime() + getUtcOffsetMin(timeZone, now) * 60_000).toISOString().slice(0, 16);
}

function shipmentColumns(tz: string): Array<Column<MovementView>> {
  return [
    { key: "to", header: "Shipment", cell: (m) => <HolderLink holder={m.to} showKind={false} /> },
    { key: "at", header: "Shipped", cell: (m) => when(m.at, tz) },
    { key: "mass", header: "Mass", numeric: true, cell: (m) => kgExact(m.massG) },
    { key: "volume", header: "Volume", numeric: true, cell: (m) => (m.volumeMl === null ? "—" : litres(m.volumeMl)) },
  ];
}

function transferColumns(tz: string): Array<Column<MovementView>> {
  return [
    { key: "to", header: "To", cell: (m) => <HolderLink holder={m.to} /> },
    { key: "at", header: "When", cell: (m) => when(m.at, tz) },
    { key: "mass", header: "Mass", numeric: true, cell: (m) => kgExact(m.massG) },
  ];
}

function decisionFacts(
  p: { status: string; deviation: boolean; decisionReason: string; decidedBy: string | null; decidedAt: Date | null },
  tz: string,
): Array<readonly [string, React.ReactNode]> {
  const out: Array<readonly [string, React.ReactNode]> = [];
  if (p.decidedAt) out.push(["Decided", `${when(p.decidedAt, tz)}${p.decidedBy ? `, ${p.decidedBy}` : ""}`]);
  if (p.decisionReason)
    out.push([p.deviation && p.status === "RELEASED" ? "Deviation accepted" : "Reason", p.decisionReason]);
  return out;
}

/** What left the lot: shipments to customers, and moves into storage. */
function WhereItWasSent({ outgoing, tz }: { outgoing: readonly MovementView[]; tz: string }) {
  const shipments = outgoing.filter((m) => m.to.kind === "SHIPMENT");
  const transfers = outgoing.filter((m) => m.to.kind !== "SHIPMENT");
  return (
    <>
      <h2>Shipments</h2>
      <DataTable
        caption="Shipped from this lot"
        hideCaption
        columns={shipmentColumns(tz)}
        rows={shipments}
        rowKey={(m) => m.id}
        empty="Nothing has been shipped from this lot directly."
      />
      {transfers.length > 0 ? (
        <>
          <h2>Moved to storage</h2>
          <DataTable
            caption="Moved to storage"
            hideCaption
            columns={transferColumns(tz)}
            rows={transfers}
            rowKey={(m) => m.id}
            empty=""
          />
        </>
      ) : null}
    </>
  );
}

type ProductQc = NonNullable<Awaited<ReturnType<typeof loadProductLotQc>>>;

/** The product lot's number, state, key facts, and its certificate, shipping, history and trace links. */
function ProductHeader({
  p,
  c,
  tz,
  role,
}: {
  p: ProductQc["detail"];
  c: ProductQc["certificate"];
  tz: string;
  role: SiteRole;
}) {
  const statusLabel = p.status === "RELEASED" && p.deviation ? "Released with a deviation" : undefined;
  const certHref = `/api/products/${encodeURIComponent(p.code)}/certificate`;
  return (
    <RecordHeader
      kind="Product lot"
      number={p.code}
      status={{ code: p.status, ...(statusLabel ? { label: statusLabel } : {}) }}
      back={{ href: "/products", label: "Product lots" }}
      facts={[
        ["Batch", p.batchCode ? <Link href={`/batches/${encodeURIComponent(p.batchCode)}`}>{p.batchCode}</Link> : "—"],
        ["Batch state", p.batchStatus ? labelOf(p.batchStatus) : "—"],
        ["Produced", when(p.producedAt, tz)],
        ["Mass made", kg(p.massG, 3)],
        ["Book stock", kg(p.stockG, 3)],
        ["Specification", c ? c.specText : "none chosen"],
        ...decisionFacts(p, tz),
      ]}
      actions={
        <>
          {c ? (
            <a href={certHref} download>
              {c.released ? "Certificate of analysis (PDF)" : "Draft certificate, not released (PDF)"}
            </a>
          ) : null}{" "}
          {p.status === "RELEASED" && p.stockG > 0 && role === "COMPLIANCE" ? (
            <Link href={`/shipments/new?from=${encodeURIComponent(p.code)}`}>Ship from this lot</Link>
          ) : null}{" "}
          <HistoryLink kind="product" recordKey={p.code} label="product lot" />
          <TraceThis kind="PRODUCT_LOT" code={p.code} role={role} back />
        </>
      }
    />
  );
}

export default async function ProductLotPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const qc = await loadProductLotQc(db, site.id, codeParam((await params).code), user.now);
  if (!qc) notFound();
  const { detail: p, spec, certificate: c } = qc;
  const [madeOf, specChoices] = await Promise.all([
    p.incoming.length > 0
      ? getMadeOf(db, site.id, p.holderId, user.now)
      : Promise.resolve({ totalG: 0, shares: [], feedstockG: 0, reagents: [], order: "dated" as const }),
    listSpecChoices(db, site.id).then((list) => list.map((c) => [c.key, c.label] as const)),
  ]);
  const tz = site.timeZone;
  const held = p.status === "HELD";
  const canEnter = held && spec !== null && (user.role === "PRODUCTION" || user.role === "COMPLIANCE");
  const isCompliance = user.role === "COMPLIANCE";
  const nextProperty = c?.rows.find((r) => r.verdict === "MISSING")?.key ?? spec?.properties[0]?.key ?? "";
  const labels = new Map((spec?.properties ?? []).map((x) => [x.key, x.label]));
  return (
    <>
      <ProductHeader p={p} c={c} tz={tz} role={user.role} />

      <h2>Quality control</h2>
      {spec && c ? (
        <>
          <ReleaseCheck c={c} />
          <SpecResults c={c} spec={spec} timeZone={tz} />
        </>
      ) : (
        <Empty>No specification is chosen for this lot; choose one to judge its results.</Empty>
      )}

      {canEnter && spec ? (
        <section aria-labelledby="enter-h">
          <h2 id="enter-h">Enter a result</h2>
          <p className="lede">
            Judged at once against the specification. A second result for the same property is a re-test: it replaces
            the first, which stays on record.
          </p>
          <QcEntryForm code={p.code} spec={spec} nextProperty={nextProperty} nowLocal={localNow(user.now, tz)} />
        </section>
      ) : null}

      {isCompliance && p.status !== "REJECTED" ? (
        <section aria-labelledby="decide-h">
          <h2 id="decide-h">Release decision</h2>
          <p className="lede">
            Release needs every required result in and within limits. A deviation, a hold or a rejection needs a reason.
          </p>
          <DecisionForm code={p.code} status={p.status} />
          {held ? (
            <>
              <h3>Specification</h3>
              <SpecChoiceForm code={p.code} current={p.specKey} choices={specChoices} />
            </>
          ) : null}
        </section>
      ) : null}

      <h2>Every result entered</h2>
      <ResultHistory qc={p.qc} labels={labels} timeZone={tz} />

      <WhereItWasSent outgoing={p.outgoing} tz={tz} />

      <h2>Feedstock and reagent lots in this product lot</h2>
      <MadeOf madeOf={madeOf} what="product lot" />
    </>
  );
}
