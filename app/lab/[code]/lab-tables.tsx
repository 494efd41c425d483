import type { getLotDetail } from "@/lib/feedstock/lot-detail.store";
import type { summariseReplicates } from "@/lib/titration/replicates";
import { num, pct, when } from "@/app/_ui/format";
import { Note } from "@/app/_ui/ui";
import { VoidResultForm } from "@/app/corrections/correction-forms";
import { TableHead, numeric } from "@/app/_ui/kit/table-head";

// The lab page's tables: the lot's titrations with their readings, the replicate check, and its other tests.

type LotDetail = NonNullable<Awaited<ReturnType<typeof getLotDetail>>>;

const TEST_LABEL: Record<string, string> = {
  WATER: "Water",
  INSOLUBLES: "Insolubles",
  UNSAPONIFIABLES: "Unsaponifiables",
};

/** Each valid titration with the readings as taken and the FFA and acid value worked out from them. */
export function TitrationTable({
  titrations,
  tz,
  canWrite,
}: {
  titrations: LotDetail["titrations"];
  tz: string;
  canWrite: boolean;
}) {
  const valid = titrations;
  return (
    <div className="table-wrap">
      <table>
        <TableHead
          headings={[
            "Tested",
            "Analyst",
            numeric("Sample"),
            "Titrant",
            numeric("Strength"),
            numeric("Titre"),
            numeric("Blank"),
            "FFA as",
            numeric("FFA"),
            numeric("Acid value"),
            canWrite ? "Correct" : null,
          ]}
        />
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
  );
}

/** Whether the replicates on each basis agree within the repeatability allowance. */
export function ReplicateNotes({
  summaries,
  mixedBases,
}: {
  summaries: ReadonlyArray<{ basis: string; summary: ReturnType<typeof summariseReplicates> }>;
  mixedBases: boolean;
}) {
  return (
    <>
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
      {mixedBases ? (
        <Note>
          The titrations name different fatty acids, so each is converted to its acid value before the mean is taken;
          the mean is shown as oleic, and the recipe neutralises the same moles of acid.
        </Note>
      ) : null}
    </>
  );
}

/** Water and the other tests, valid ones only. */
export function OtherTestsTable({
  tests,
  tz,
  canWrite,
}: {
  tests: LotDetail["labTests"];
  tz: string;
  canWrite: boolean;
}) {
  return (
    <div className="table-wrap">
      <table>
        <TableHead headings={["Tested", "Test", "Method", "Analyst", numeric("Result"), canWrite ? "Correct" : null]} />
        <tbody>
          {tests.map((t) => (
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
  );
}
