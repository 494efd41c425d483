import { CA5A40_AV_PER_FFA_OLEIC } from "@/lib/titration/titration";
import type { FfaBasis } from "@/lib/titration/titration";
import { DEFAULT_FFA_REPEATABILITY, summariseReplicates } from "@/lib/titration/replicates";
import { workTitration } from "@/lib/titration/arithmetic";
import { formatFixed } from "@/lib/quantity/units";
import { toNumber } from "@/app/_ui/kit/form-state";
import type { TitrationValues } from "@/app/lab/[code]/titration-fields";
import { FFA_BASES } from "@/lib/titration/titration";

function f(n: number, d: number): string {
  return formatFixed(n, d);
}

/** The same pure functions the server uses, run as the analyst types. */
function computeLive(v: TitrationValues, recorded: ReadonlyArray<{ basis: string; ffaPct: number }>) {
  const sampleMassG = toNumber(v.sampleMassG);
  const concentrationMolL = toNumber(v.concentrationMolL);
  const titreMl = toNumber(v.titreMl);
  if (sampleMassG === undefined || concentrationMolL === undefined || titreMl === undefined)
    return { kind: "incomplete" as const };
  const basis = (FFA_BASES as readonly string[]).includes(v.basis) ? (v.basis as FfaBasis) : "OLEIC";
  const w = workTitration({ sampleMassG, concentrationMolL, titreMl, blankMl: toNumber(v.blankMl) ?? 0 }, basis);
  if (!w.ok) return { kind: "invalid" as const, messages: w.issues.map((i) => i.message) };
  const same = recorded.filter((r) => r.basis === basis).map((r) => r.ffaPct);
  const reps = summariseReplicates([...same, w.value.ffaPct]);
  return { kind: "ok" as const, w: w.value, reps: reps.ok ? reps.value : null, previous: same.length };
}

/** The acid value and FFA as the analyst types, each with its arithmetic, and the repeatability with earlier results. */
export function TitrationWorking({
  values,
  recorded,
}: {
  values: TitrationValues;
  recorded: ReadonlyArray<{ basis: string; ffaPct: number }>;
}) {
  const live = computeLive(values, recorded);
  return (
    <section className="live-result" aria-live="polite" aria-label="Computed as you type">
      {live.kind === "incomplete" ? (
        <p className="muted">Enter sample mass, concentration and titre to see the acid value and the FFA.</p>
      ) : live.kind === "invalid" ? (
        <p className="warning">Cannot compute yet: {live.messages.join("; ")}</p>
      ) : (
        <>
          <dl className="live-figures">
            <div>
              <dt>Acid value</dt>
              <dd data-testid="live-av">{f(live.w.acidValueMgKohG, 2)} mg KOH/g</dd>
            </div>
            <div>
              <dt>FFA</dt>
              <dd data-testid="live-ffa">{f(live.w.ffaPct, 2)} %</dd>
            </div>
            <div>
              <dt>Net titre</dt>
              <dd>{f(live.w.netTitreMl, 2)} mL</dd>
            </div>
            {live.reps && live.reps.n > 1 ? (
              <div>
                <dt>With the {live.previous} recorded</dt>
                <dd>
                  mean {f(live.reps.mean, 2)} %, spread {f(live.reps.spread, 2)} (allowed{" "}
                  {f(live.reps.allowedSpread, 2)}){" "}
                  {live.reps.exceedsRepeatability ? (
                    <span className="status status-fail">repeat the titration</span>
                  ) : (
                    <span className="status status-pass">repeatable</span>
                  )}
                </dd>
              </div>
            ) : null}
          </dl>
          <ol className="note working" data-testid="titration-working" aria-label="How the figures are worked out">
            {live.w.lines.map((l) => (
              <li key={l}>{l}</li>
            ))}
          </ol>
          <p className="note">
            The FFA saved is the Ca 5a-40 figure; the line from the acid value checks it by the acid&apos;s molar mass
            {values.basis === "OLEIC"
              ? ` (the method's own note: acid value ≈ FFA × ${CA5A40_AV_PER_FFA_OLEIC.value})`
              : ""}
            . Repeatability: {DEFAULT_FFA_REPEATABILITY.source}.
          </p>
        </>
      )}
    </section>
  );
}
