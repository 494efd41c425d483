import type { Metadata } from "next";
import Link from "next/link";
import { TraceThis } from "@/app/_ui/trace-this";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import { getLotDetail } from "@/lib/feedstock/lot-detail.store";
import type { LotDetail } from "@/lib/feedstock/lot-detail.store";
import { getLotFlow } from "@/lib/feedstock/lot-flow.service";
import { kg, litres, num, pct, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { RecordHeader } from "@/app/_ui/kit";
import { MoveLotSection } from "@/app/lots/[code]/move-lot";
import { LotRecords } from "@/app/lots/[code]/lot-tables";
import { WhereItWent } from "@/app/lots/[code]/where-it-went";
import { Facts, NoSite, Note } from "@/app/_ui/ui";
import { ReportLinks } from "@/app/_ui/report-view";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Lot ${codeParam((await params).code)}` };
}

function cameFrom(lot: LotDetail) {
  if (lot.origin !== "DELIVERY") return `${lot.pickups.length} pickup${lot.pickups.length === 1 ? "" : "s"}`;
  return (
    <>
      Delivery {lot.deliveryDocument ?? ""} from{" "}
      {lot.supplier ? (
        <Link href={`/sources/${encodeURIComponent(lot.supplier.code)}`}>{lot.supplier.name}</Link>
      ) : (
        "a supplier"
      )}
    </>
  );
}

function lotFacts(lot: LotDetail, tz: string): Array<readonly [string, React.ReactNode]> {
  const ffa = lot.titrations.filter((t) => !t.voided);
  return [
    ["Material", labelOf(lot.material)],
    ["Received", when(lot.receivedAt, tz)],
    ["Came from", cameFrom(lot)],
    ["Certified material", lot.certified ? "Yes" : "No"],
    ["Mass received", kg(lot.massG, 3)],
    ["Book stock now", kg(lot.stockG, 3)],
    [
      "FFA (mean of titrations)",
      ffa.length ? pct(ffa.reduce((s, t) => s + t.ffaPct, 0) / ffa.length) : "not titrated yet",
    ],
  ];
}

function MeasurementBasis({ lot }: { lot: LotDetail }) {
  return (
    <>
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
    </>
  );
}

export default async function LotPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const lot = await getLotDetail(db, site.id, codeParam((await params).code));
  if (!lot) notFound();
  const flow = await getLotFlow(db, site.id, lot.holderId, new Date());
  const tz = site.timeZone;
  return (
    <>
      <RecordHeader
        kind="Lot"
        number={lot.code}
        status={{ code: lot.status }}
        back={{ href: "/lots", label: "Lots" }}
        facts={lotFacts(lot, tz)}
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
      <MeasurementBasis lot={lot} />
      <LotRecords lot={lot} timeZone={tz} />
      <WhereItWent flow={flow} lotCode={lot.code} timeZone={tz} />
    </>
  );
}
