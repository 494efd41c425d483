import type { BatchDetail } from "@/lib/batch/batch.store";
import type { BatchClosure } from "@/lib/batch/closure";
import type { ClosureTolerance } from "@/lib/mass-balance/period-balance";
import type { MovementView } from "@/lib/ledger/movement.store";
import { labelOf } from "@/lib/core/vocabulary";
import { kg } from "@/app/_ui/format";
import { CodeLink, Empty, Facts, MovementTable, Note, Status } from "@/app/_ui/ui";
import { TakeBackChargeForm } from "@/app/corrections/correction-forms";
import { ClosureChip, ToleranceNote } from "@/app/balance/closure";
import { CorrectOutputForm } from "@/app/batches/[code]/correct-output-form";
import { TableHead, numeric } from "@/app/_ui/kit/table-head";

// The batch page's sections: what went in, what came out, the closure of the two, and the product lots made.

/** What was charged, with the take-back for a reacting batch and the charges taken back. */
export function ChargesSection({ b, tz }: { b: BatchDetail; tz: string }) {
  return (
    <>
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
    </>
  );
}

/** What was weighed or gauged out, and the outputs corrected. */
export function OutputsSection({ b, tz }: { b: BatchDetail; tz: string }) {
  return (
    <>
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
    </>
  );
}

/** Charged against measured out: the unmeasured difference, flagged against the site's tolerance. */
export function ClosureSection({
  b,
  closure,
  tolerance,
  canCorrect,
}: {
  b: BatchDetail;
  closure: BatchClosure;
  tolerance: ClosureTolerance;
  canCorrect: boolean;
}) {
  return (
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
          The unmeasured difference is above the site&apos;s tolerance: check the weighbridge tickets and gauges, lines
          and filters for hold-up, and drains and valves for leaks. If an output was typed wrong, correct it below.
        </p>
      ) : null}
      <Note>
        The unmeasured difference is what was charged less everything weighed or gauged out and the recorded losses; it
        is booked when the batch finishes, never typed. <ToleranceNote tolerance={tolerance} />
      </Note>
      {canCorrect && b.outputs.length > 0 ? (
        <>
          <h3>Correct an output typed wrong</h3>
          <p>
            The wrong entry stays on record, reversed, and the output is booked again with the right mass at its
            original time; the unmeasured difference is worked out again. Refused when the material has moved on since
            or the period is closed.
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
  );
}

export function ProductLotsTable({ products }: { products: BatchDetail["products"] }) {
  return (
    <>
      {products.length === 0 ? (
        <Empty>This batch has made no product lot yet.</Empty>
      ) : (
        <div className="table-wrap">
          <table>
            <TableHead headings={["Product lot", "Status", numeric("Mass made")]} />
            <tbody>
              {products.map((p) => (
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
    </>
  );
}
