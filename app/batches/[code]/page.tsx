import type { Metadata } from "next";
import Link from "next/link";
import { TraceThis } from "@/app/_ui/trace-this";
import { notFound } from "next/navigation";
import { labelOf } from "@/lib/core/vocabulary";
import { getBatchDetail } from "@/lib/batch/batch.store";
import { getMadeOf } from "@/lib/feedstock/lot-flow.service";
import { kg, num, when } from "@/app/_ui/format";
import { codeParam } from "@/app/_ui/links";
import { MadeOf } from "@/app/_ui/made-of";
import { loadSite } from "@/app/_ui/site";
import { CodeLink, Empty, Facts, MovementTable, NoSite, Note, Status } from "@/app/_ui/ui";
import { BatchPlanSection } from "@/app/batches/[code]/batch-plan-section";
import { TakeBackChargeForm } from "@/app/corrections/correction-forms";
import type { MovementView } from "@/lib/ledger/movement.store";
import { summarizeBatchClosure } from "@/lib/batch/closure";
import { getSiteLimits } from "@/lib/site/site-limits.service";
import { ClosureChip, ToleranceNote } from "@/app/balance/closure";
import { CorrectOutputForm } from "@/app/batches/[code]/correct-output-form";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: `Batch ${codeParam((await params).code)}` };
}

function prettyRecipe(json: string): string | null {
  try {
    const value: unknown = JSON.parse(json);
    if (value === null || (typeof value === "object" && Object.keys(value).length === 0)) return null;
    return JSON.stringify(value, null, 2);
  } catch {
    return json;
  }
}

export default async function BatchPage({ params }: Props) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const b = await getBatchDetail(db, site.id, codeParam((await params).code));
  if (!b) notFound();
  const madeOf =
    b.charges.length > 0
      ? await getMadeOf(db, site.id, b.holderId, new Date())
      : { totalG: 0, shares: [], feedstockG: 0, reagents: [], order: "dated" as const };
  const tz = site.timeZone;
  const chargedG = b.charges.reduce((s, m) => s + m.massG, 0);
  const outG = b.outputs.reduce((s, m) => s + m.massG, 0);
  const tolerance = (await getSiteLimits(db, site.id)).closure;
  const closure = summarizeBatchClosure(
    [
      ...b.charges.map((m) => ({ role: m.role, massG: m.massG, direction: "IN" as const })),
      ...b.outputs.map((m) => ({ role: m.role, massG: m.massG, direction: "OUT" as const })),
      ...b.unmeasured.map((m) => ({
        role: m.role,
        massG: m.massG,
        direction: m.to.id === b.holderId ? ("IN" as const) : ("OUT" as const),
      })),
    ],
    tolerance,
  );
  const finished = b.status === "COMPLETE";
  const recipe = prettyRecipe(b.recipeJson);
  return (
    <>
      <p className="crumbs">
        <Link href="/batches">Batches</Link> /
      </p>
      <h1>Batch {b.code}</h1>
      <Facts
        items={[
          ["Status", <Status key="s" code={b.status} />],
          ["Planned", when(b.plannedAt, tz)],
          ["Started", when(b.startedAt, tz)],
          ["Finished", when(b.completedAt, tz)],
          ["Target oil", kg(b.targetOilG)],
          ["Methanol : oil molar ratio", `${num(b.molarRatio, 1)} : 1`],
          ["Catalyst", labelOf(b.catalyst)],
          ["Reaction temperature", `${num(b.reactionTempC, 1)} °C`],
          ["Acid pretreatment", b.pretreated ? "Yes" : "No"],
          ["Charged", kg(chargedG, 3)],
          ["Out", kg(outG, 3)],
          ...(finished ? [] : ([["Still in the reactor", kg(b.stockG, 3)]] as Array<[string, string]>)),
        ]}
      />
      <TraceThis kind="BATCH" code={b.code} role={user.role} back />
      {b.notes ? <p>Notes: {b.notes}</p> : null}
      <BatchPlanSection batch={b} />

      <h2>Charges in</h2>
      {b.charges.length === 0 ? (
        <Empty>Nothing has been charged yet.</Empty>
      ) : (
        <MovementTable
          rows={b.charges}
          timeZone={tz}
          side="to"
          {...(b.status === "RUNNING"
            ? {
                action: {
                  header: "Correction",
                  render: (m: MovementView) =>
                    m.reversesId === null ? <TakeBackChargeForm movementId={m.id} /> : null,
                },
              }
            : {})}
        />
      )}
      {b.status === "RUNNING" && b.charges.length > 0 ? (
        <Note>
          A charge booked by mistake (wrong tank or lot, wrong mass) can be taken back while the batch is reacting: the
          record gets an opposite movement with your reason, and traces and balances leave the pair out. This only
          corrects the books. If material really has to leave the reactor, follow the plant&apos;s written procedure and
          the safety data sheets: methanol and methoxide are toxic and flammable, hydroxides and acid are corrosive, and
          the charge may be hot.
        </Note>
      ) : null}
      {b.takenBack.length > 0 ? (
        <>
          <h3>Charges taken back</h3>
          <MovementTable
            rows={b.takenBack}
            timeZone={tz}
            side="to"
            caption="Booked by mistake and reversed; not counted in the batch."
          />
        </>
      ) : null}

      <h2>Feedstock and reagent lots in this batch</h2>
      <MadeOf madeOf={madeOf} what="batch" />

      <h2>Outputs</h2>
      {b.outputs.length === 0 ? (
        <Empty>No outputs recorded yet.</Empty>
      ) : (
        <MovementTable rows={b.outputs} timeZone={tz} side="from" />
      )}
      {b.corrected.length > 0 ? (
        <>
          <h3>Outputs corrected</h3>
          <MovementTable
            rows={b.corrected}
            timeZone={tz}
            side="from"
            caption="Typed wrong and reversed; the corrected entries are in the outputs above."
          />
        </>
      ) : null}

      {finished ? (
        <section aria-labelledby="closure-h">
          <h2 id="closure-h">Closure</h2>
          <Facts
            items={[
              ["Charged", kg(closure.chargedG, 3)],
              ["Weighed or gauged out", kg(closure.measuredG, 3)],
              ["Recorded losses", kg(closure.recordedLossG, 3)],
              [
                "Unmeasured difference",
                <span key="u" data-testid="batch-unmeasured">
                  {kg(closure.differenceG, 3)}
                </span>,
              ],
              ["Share of the charge", <ClosureChip key="c" closure={closure.closure} what="of the charge" />],
            ]}
          />
          {closure.closure.flag !== "OK" ? (
            <p className="warning" role="status">
              The unmeasured difference is above the site&apos;s tolerance: check the weighbridge tickets and gauges,
              lines and filters for hold-up, and drains and valves for leaks. If an output was typed wrong, correct it
              below.
            </p>
          ) : null}
          <Note>
            The unmeasured difference is what was charged less everything weighed or gauged out and the recorded losses;
            it is booked when the batch finishes, never typed. <ToleranceNote tolerance={tolerance} />
          </Note>
          {user.role === "PRODUCTION" && b.outputs.length > 0 ? (
            <>
              <h3>Correct an output typed wrong</h3>
              <p>
                The wrong entry stays on record, reversed, and the output is booked again with the right mass at its
                original time; the unmeasured difference is worked out again. Refused when the material has moved on
                since or the period is closed.
              </p>
              <CorrectOutputForm
                batchCode={b.code}
                outputs={b.outputs.map(
                  (m) => [String(m.id), `No. ${m.id} · ${labelOf(m.role)} → ${m.to.code} · ${kg(m.massG, 3)}`] as const,
                )}
              />
            </>
          ) : null}
        </section>
      ) : null}

      <h2>Product lots</h2>
      {b.products.length === 0 ? (
        <Empty>This batch has made no product lot yet.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <thead>
              <tr>
                <th scope="col">Product lot</th>
                <th scope="col">Status</th>
                <th scope="col" className="num">
                  Mass made
                </th>
              </tr>
            </thead>
            <tbody>
              {b.products.map((p) => (
                <tr key={p.code}>
                  <td>
                    <CodeLink href={`/products/${encodeURIComponent(p.code)}`} code={p.code} />
                  </td>
                  <td>
                    <Status code={p.status} />
                  </td>
                  <td className="num">{kg(p.massG)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      {recipe ? (
        <>
          <h2>Recipe as planned</h2>
          <details>
            <summary>Show the stored recipe</summary>
            <pre className="recipe">{recipe}</pre>
          </details>
          <Note>The recipe is the plan; the charges above are what was actually put in.</Note>
        </>
      ) : null}
    </>
  );
}
