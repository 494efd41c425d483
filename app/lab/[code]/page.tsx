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
import { VoidResultForm } from "@/app/corrections/correction-forms";
import { Empty, Facts, NoSite, Note, Status } from "@/app/_ui/ui";
import { LabCautions } from "@/app/lab/lab-cautions";
import { DecisionForm } from "@/app/lab/[code]/decision-form";
import { LabTestForm } from "@/app/lab/[code]/lab-test-form";
import { TitrationForm } from "@/app/lab/[code]/titration-form";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Lab: lot ${codeParam((await params).code)}` };
}

const TEST_LABEL: Record<string, string> = {
  WATER: "Water",
  INSOLUBLES: "Insolubles",
  UNSAPONIFIABLES: "Unsaponifiables",
};

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
  const latestWater = [...lot.labTests].reverse().find((t) => !t.voided && t.kind === "WATER");
  return (
    <>
      <p className="crumbs">
        <Link href="/lab">Lab</Link> /
      </p>
      <h1>Lab results for lot {lot.code}</h1>
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
      <p>
        <Link href={`/lots/${encodeURIComponent(lot.code)}`}>Lot record, measurement and where it went</Link>
      </p>

      <h2 id="titration-h">Titrations</h2>
      {valid.length === 0 ? (
        <Empty>No titrations recorded yet.</Empty>
      ) : (
        <>
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
                  {canWrite ? <th scope="col">Correct</th> : null}
                </tr>
              </thead>
              <tbody>
                {valid.map((t) => (
                  <tr key={t.id}>
                    <td className="nowrap">{when(t.testedAt, tz)}</td>
                    <td>{t.analyst}</td>
                    <td className="num">{num(t.sampleMassG, 3)} g</td>
                    <td>{t.titrant === "NAOH" ? "NaOH" : "KOH"}</td>
                    <td className="num">{num(t.concentrationMolL, 4)} mol/L</td>
                    <td className="num">{num(t.titreMl, 2)} mL</td>
                    <td className="num">{num(t.blankMl, 2)} mL</td>
                    <td>{t.basis.charAt(0) + t.basis.slice(1).toLowerCase()}</td>
                    <td className="num">{pct(t.ffaPct)}</td>
                    <td className="num">{num(t.acidValue, 2)} mg KOH/g</td>
                    {canWrite ? (
                      <td>
                        <VoidResultForm kind="TITRATION" resultId={t.id} />
                      </td>
                    ) : null}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {summaries.map(({ basis, summary }) =>
            summary.ok && summary.value.n > 1 ? (
              <p key={basis} className={summary.value.exceedsRepeatability ? "warning" : "note"}>
                {summary.value.n} replicates as {basis.toLowerCase()}: mean {num(summary.value.mean, 2)} %, spread{" "}
                {num(summary.value.spread, 2)} (allowed {num(summary.value.allowedSpread, 2)}).{" "}
                {summary.value.exceedsRepeatability
                  ? "The replicates disagree more than allowed: titrate again."
                  : "Within the repeatability allowance."}
              </p>
            ) : null,
          )}
          {bases.length > 1 ? (
            <Note>
              The titrations name different fatty acids, so each is converted to its acid value before the mean is
              taken; the mean is shown as oleic, and the recipe neutralises the same moles of acid.
            </Note>
          ) : null}
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
                {canWrite ? <th scope="col">Correct</th> : null}
              </tr>
            </thead>
            <tbody>
              {lot.labTests
                .filter((t) => !t.voided)
                .map((t) => (
                  <tr key={t.id}>
                    <td className="nowrap">{when(t.testedAt, tz)}</td>
                    <td>{TEST_LABEL[t.kind] ?? t.kind}</td>
                    <td>{t.method}</td>
                    <td>{t.analyst}</td>
                    <td className="num">{pct(t.valuePct)}</td>
                    {canWrite ? (
                      <td>
                        <VoidResultForm kind="LAB_TEST" resultId={t.id} />
                      </td>
                    ) : null}
                  </tr>
                ))}
            </tbody>
          </table>
        </div>
      )}
      {canWrite && open ? (
        <>
          <h3 id="test-form-h">Record a test result</h3>
          <LabCautions kind="tests" />
          <LabTestForm lotCode={lot.code} />
        </>
      ) : null}

      <h2>Decision</h2>
      {lot.status !== "QUARANTINED" ? (
        <p>
          This lot is <Status code={lot.status} />.
        </p>
      ) : canWrite ? (
        <DecisionForm lotCode={lot.code} titrations={valid.length} />
      ) : (
        <Note>Only production staff record lab results and accept or reject lots; this page is read-only for you.</Note>
      )}
      {!canWrite && lot.status !== "QUARANTINED" ? (
        <Note>Only production staff record lab results; this page is read-only for you.</Note>
      ) : null}
    </>
  );
}
