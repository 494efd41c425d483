import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import { getLotDetail } from "@/lib/feedstock/lot-detail.store";
import { toFfaBasis } from "@/lib/titration/titration";
import { combineFfaReadings, summariseReplicates } from "@/lib/titration/replicates";
import { ffa, kg, num, pct, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { Empty, Facts, NoSite, Note, Status } from "@/app/_ui/ui";
import { LabCautions } from "@/app/lab/lab-cautions";
import { DecisionForm } from "@/app/lab/[code]/decision-form";
import { LabTestForm } from "@/app/lab/[code]/lab-test-form";
import { TitrationForm } from "@/app/lab/[code]/titration-form";
import { OtherTestsTable, ReplicateNotes, TitrationTable } from "@/app/lab/[code]/lab-tables";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Lab: lot ${codeParam((await params).code)}` };
}

/** The lot at a glance: what it is, its status, and its FFA and water so far. */
function LotFacts({
  lot,
  mean,
  tz,
}: {
  lot: NonNullable<Awaited<ReturnType<typeof getLotDetail>>>;
  mean: ReturnType<typeof combineFfaReadings>;
  tz: string;
}) {
  const latestWater = [...lot.labTests].reverse().find((t) => !t.voided && t.kind === "WATER");
  return (
    <Facts
      items={[
        ["Material", labelOf(lot.material)],
        ["Status", <Status key="s" code={lot.status} />],
        ["Received", when(lot.receivedAt, tz)],
        ["Mass received", kg(lot.massG, 1)],
        [
          "FFA (mean of valid titrations)",
          mean.ok
            ? `${ffa(mean.value.ffaPct, mean.value.basis)} (acid value ${num(mean.value.acidValueMgKohG, 2)} mg KOH/g)`
            : "not titrated yet",
        ],
        ["Water (latest)", latestWater ? pct(latestWater.valuePct) : "not tested yet"],
      ]}
    />
  );
}

/** Accept or reject a quarantined lot; otherwise its status. */
function DecisionSection({
  status,
  lotCode,
  titrations,
  canWrite,
}: {
  status: string;
  lotCode: string;
  titrations: number;
  canWrite: boolean;
}) {
  return (
    <>
      <h2>Decision</h2>
      {status !== "QUARANTINED" ? (
        <p>
          This lot is <Status code={status} />.
        </p>
      ) : canWrite ? (
        <DecisionForm lotCode={lotCode} titrations={titrations} />
      ) : (
        <Note>Only production staff record lab results and accept or reject lots; this page is read-only for you.</Note>
      )}
      {!canWrite && status !== "QUARANTINED" ? (
        <Note>Only production staff record lab results; this page is read-only for you.</Note>
      ) : null}
    </>
  );
}

export default async function LabLotPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const lot = await getLotDetail(db, site.id, codeParam((await params).code));
  if (!lot) notFound();
  const tz = site.timeZone;
  const valid = lot.titrations.filter((t) => !t.voided);
  const bases = [...new Set(valid.map((t) => t.basis))];
  const summaries = bases.map((basis) => ({
    basis,
    summary: summariseReplicates(valid.filter((t) => t.basis === basis).map((t) => t.ffaPct)),
  }));
  const mean = combineFfaReadings(
    valid.map((t) => ({ ffaPct: t.ffaPct, basis: toFfaBasis(t.basis), acidValueMgKohG: t.acidValue })),
  );
  const canWrite = user.role === "PRODUCTION";
  const open = lot.status === "QUARANTINED" || lot.status === "ACCEPTED";
  return (
    <>
      <p className="crumbs">
        <Link href="/lab">Lab</Link> /
      </p>
      <h1>Lab results for lot {lot.code}</h1>
      <LotFacts lot={lot} mean={mean} tz={tz} />
      <p>
        <Link href={`/lots/${encodeURIComponent(lot.code)}`}>Lot record, measurement and where it went</Link>
      </p>

      <h2 id="titration-h">Titrations</h2>
      {valid.length === 0 ? (
        <Empty>No titrations recorded yet.</Empty>
      ) : (
        <>
          <TitrationTable titrations={valid} tz={tz} canWrite={canWrite} />
          <ReplicateNotes summaries={summaries} mixedBases={bases.length > 1} />
        </>
      )}

      {lot.titrations.length + lot.labTests.length > valid.length + lot.labTests.filter((t) => !t.voided).length ? (
        <p className="note">
          {lot.titrations.length - valid.length + lot.labTests.filter((t) => t.voided).length} voided result(s) are kept
          on record and no longer count;{" "}
          <Link href={`/history?${new URLSearchParams({ kind: "lot", key: lot.code }).toString()}`}>
            see the lot&apos;s history
          </Link>
          .
        </p>
      ) : null}
      {canWrite && open ? (
        <>
          <h3 id="titration-form-h">Record a titration</h3>
          <LabCautions kind="titration" />
          <TitrationForm lotCode={lot.code} recorded={valid.map((t) => ({ basis: t.basis, ffaPct: t.ffaPct }))} />
        </>
      ) : null}

      <h2>Water and other tests</h2>
      {lot.labTests.filter((t) => !t.voided).length === 0 ? (
        <Empty>No other tests recorded yet.</Empty>
      ) : (
        <OtherTestsTable tests={lot.labTests.filter((t) => !t.voided)} tz={tz} canWrite={canWrite} />
      )}
      {canWrite && open ? (
        <>
          <h3 id="test-form-h">Record a test result</h3>
          <LabCautions kind="tests" />
          <LabTestForm lotCode={lot.code} />
        </>
      ) : null}

      <DecisionSection status={lot.status} lotCode={lot.code} titrations={valid.length} canWrite={canWrite} />
    </>
  );
}
