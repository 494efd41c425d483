"use client";
import { startTransition, useActionState, useEffect, useState } from "react";
import {
  CA5A40_AV_PER_FFA_OLEIC,
  FFA_BASES,
  acidValueFromFfa,
  calculateAcidValue,
  calculateFfaPercent,
} from "@/lib/titration/titration";
import { DEFAULT_FFA_REPEATABILITY, summariseReplicates } from "@/lib/titration/replicates";
import { suggestSampleSize } from "@/lib/titration/sample-size";
import type { FfaBasis } from "@/lib/titration/titration";
import { formatFixed } from "@/lib/quantity/units";
import { recordTitrationAction } from "@/app/lab/[code]/actions";
import { IDLE, toNumber } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";

type Values = Record<"sampleMassG" | "titrant" | "concentrationMolL" | "titreMl" | "blankMl" | "basis", string>;

const START: Values = {
  sampleMassG: "",
  titrant: "NAOH",
  concentrationMolL: "",
  titreMl: "",
  blankMl: "0",
  basis: "OLEIC",
};

const BASIS_LABEL: Record<FfaBasis, string> = {
  OLEIC: "Oleic acid",
  PALMITIC: "Palmitic acid (palm oil)",
  LAURIC: "Lauric acid (coconut, palm kernel)",
};

function f(n: number, d: number): string {
  return formatFixed(n, d);
}

/** The same pure functions the server uses, run as the analyst types. */
function computeLive(v: Values, recorded: ReadonlyArray<{ basis: string; ffaPct: number }>) {
  const input = {
    sampleMassG: toNumber(v.sampleMassG),
    concentrationMolL: toNumber(v.concentrationMolL),
    titreMl: toNumber(v.titreMl),
    blankMl: toNumber(v.blankMl) ?? 0,
  };
  if (input.sampleMassG === undefined || input.concentrationMolL === undefined || input.titreMl === undefined)
    return { kind: "incomplete" as const };
  const basis = (FFA_BASES as readonly string[]).includes(v.basis) ? (v.basis as FfaBasis) : "OLEIC";
  const t = {
    sampleMassG: input.sampleMassG,
    concentrationMolL: input.concentrationMolL,
    titreMl: input.titreMl,
    blankMl: input.blankMl,
  };
  const ffa = calculateFfaPercent(t, { basis });
  const av = calculateAcidValue(t);
  if (!ffa.ok || !av.ok)
    return {
      kind: "invalid" as const,
      messages: [...(ffa.ok ? [] : ffa.issues), ...(av.ok ? [] : av.issues)].map((i) => i.message),
    };
  const same = recorded.filter((r) => r.basis === basis).map((r) => r.ffaPct);
  const reps = summariseReplicates([...same, ffa.value.ffaPct]);
  const avFromFfa = acidValueFromFfa(ffa.value.ffaPct, { basis });
  return {
    kind: "ok" as const,
    ffa: ffa.value,
    av: av.value,
    reps: reps.ok ? reps.value : null,
    previous: same.length,
    avFromFfa: avFromFfa.ok ? avFromFfa.value : null,
  };
}

function FieldError({ id, message }: { id: string; message: string | undefined }) {
  return message ? (
    <span className="field-error" id={id}>
      {message}
    </span>
  ) : null;
}

export function TitrationForm({
  lotCode,
  recorded,
}: {
  lotCode: string;
  recorded: ReadonlyArray<{ basis: string; ffaPct: number }>;
}) {
  const [state, action, pending] = useActionState<FormState, FormData>(recordTitrationAction, IDLE);
  const [values, setValues] = useState<Values>(START);
  const [expected, setExpected] = useState("");

  useEffect(() => {
    if (state.seq > 0) setValues((v) => ({ ...v, ...state.values }));
  }, [state]);

  const set = (name: keyof Values) => (e: { target: { value: string } }) =>
    setValues((v) => ({ ...v, [name]: e.target.value }));
  const live = computeLive(values, recorded);
  const expectedPct = toNumber(expected);
  const suggestion = expectedPct === undefined ? null : suggestSampleSize(expectedPct);
  const err = (name: keyof Values) => (state.status === "refused" ? state.errors[name] : undefined);
  const aria = (name: keyof Values) => ({
    "aria-invalid": err(name) ? true : undefined,
    "aria-describedby": err(name) ? `t-${name}-err` : undefined,
  });

  return (
    // Submitted through a transition rather than the form's action, so React does not reset the
    // controlled fields: after a refusal the analyst sees exactly what was typed.
    <form
      className="lab-form"
      noValidate
      aria-labelledby="titration-form-h"
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        startTransition(() => action(data));
      }}
    >
      <input type="hidden" name="lotCode" value={lotCode} />
      <div className="lab-grid">
        <div className="field">
          <label>
            Sample mass (g)
            <input
              name="sampleMassG"
              inputMode="decimal"
              autoComplete="off"
              value={values.sampleMassG}
              onChange={set("sampleMassG")}
              {...aria("sampleMassG")}
            />
          </label>
          <FieldError id="t-sampleMassG-err" message={err("sampleMassG")} />
        </div>
        <div className="field">
          <label>
            Titrant
            <select name="titrant" value={values.titrant} onChange={set("titrant")} {...aria("titrant")}>
              <option value="NAOH">NaOH (sodium hydroxide)</option>
              <option value="KOH">KOH (potassium hydroxide)</option>
            </select>
          </label>
          <FieldError id="t-titrant-err" message={err("titrant")} />
        </div>
        <div className="field">
          <label>
            Titrant concentration (mol/L)
            <input
              name="concentrationMolL"
              inputMode="decimal"
              autoComplete="off"
              value={values.concentrationMolL}
              onChange={set("concentrationMolL")}
              {...aria("concentrationMolL")}
            />
          </label>
          <FieldError id="t-concentrationMolL-err" message={err("concentrationMolL")} />
        </div>
        <div className="field">
          <label>
            Titre (mL)
            <input
              name="titreMl"
              inputMode="decimal"
              autoComplete="off"
              value={values.titreMl}
              onChange={set("titreMl")}
              {...aria("titreMl")}
            />
          </label>
          <FieldError id="t-titreMl-err" message={err("titreMl")} />
        </div>
        <div className="field">
          <label>
            Blank (mL)
            <input
              name="blankMl"
              inputMode="decimal"
              autoComplete="off"
              value={values.blankMl}
              onChange={set("blankMl")}
              {...aria("blankMl")}
            />
          </label>
          <FieldError id="t-blankMl-err" message={err("blankMl")} />
        </div>
        <div className="field">
          <label>
            FFA expressed as
            <select name="basis" value={values.basis} onChange={set("basis")} {...aria("basis")}>
              {FFA_BASES.map((b) => (
                <option key={b} value={b}>
                  {BASIS_LABEL[b]}
                </option>
              ))}
            </select>
          </label>
          <FieldError id="t-basis-err" message={err("basis")} />
        </div>
      </div>

      <section className="live-result" aria-live="polite" aria-label="Computed as you type">
        {live.kind === "incomplete" ? (
          <p className="muted">Enter sample mass, concentration and titre to see the FFA and acid value.</p>
        ) : live.kind === "invalid" ? (
          <p className="warning">Cannot compute yet: {live.messages.join("; ")}</p>
        ) : (
          <>
            <dl className="live-figures">
              <div>
                <dt>FFA</dt>
                <dd data-testid="live-ffa">{f(live.ffa.ffaPct, 2)} %</dd>
              </div>
              <div>
                <dt>Acid value</dt>
                <dd data-testid="live-av">{f(live.av.acidValueMgKohG, 2)} mg KOH/g</dd>
              </div>
              <div>
                <dt>Net titre</dt>
                <dd>{f(live.ffa.netTitreMl, 2)} mL</dd>
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
            <p className="note">
              FFA = (titre − blank) × concentration × {f(live.ffa.factor, 1)} / sample mass (AOCS Ca 5a-40); acid value
              = 56.1 × (titre − blank) × concentration / sample mass (EN 14104). From the FFA the acid value is{" "}
              {live.avFromFfa === null ? "—" : f(live.avFromFfa, 2)} mg KOH/g by molar masses
              {values.basis === "OLEIC" ? ` (the method's note: × ${CA5A40_AV_PER_FFA_OLEIC.value})` : ""}.
              Repeatability: {DEFAULT_FFA_REPEATABILITY.source}.
            </p>
          </>
        )}
      </section>

      <details className="sample-size">
        <summary>Sample size for the expected FFA</summary>
        <label>
          Expected FFA (%)
          <input inputMode="decimal" value={expected} onChange={(e) => setExpected(e.target.value)} />
        </label>
        {suggestion === null ? null : suggestion.ok ? (
          <p>
            Weigh {suggestion.value.row.sampleMassG} ± {suggestion.value.row.sampleToleranceG} g into{" "}
            {suggestion.value.row.alcoholMl} mL neutralised alcohol; titrate with{" "}
            {suggestion.value.row.concentrationsMolL.join(" or ")} mol/L (each mL ≈{" "}
            {suggestion.value.ffaPctPerMl.map((x) => f(x, 2)).join(" or ")} % FFA as oleic).{" "}
            <button
              type="button"
              className="secondary"
              onClick={() => {
                const row = suggestion.value.row;
                setValues((v) => ({
                  ...v,
                  sampleMassG: String(row.sampleMassG),
                  concentrationMolL: String(row.concentrationsMolL[0] ?? ""),
                }));
              }}
            >
              Use this sample mass and concentration
            </button>
            <span className="note"> {suggestion.value.row.source}.</span>
          </p>
        ) : (
          <p className="warning">{suggestion.issues[0]?.message}</p>
        )}
      </details>

      {state.message ? (
        <p
          className={state.status === "saved" ? "form-ok" : "form-error"}
          role={state.status === "saved" ? "status" : "alert"}
        >
          {state.message}
        </p>
      ) : null}
      <button type="submit" className="primary" disabled={pending}>
        {pending ? "Saving…" : "Save titration"}
      </button>
    </form>
  );
}
