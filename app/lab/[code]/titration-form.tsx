"use client";
import { startTransition, useActionState, useEffect, useState } from "react";
import { recordTitrationAction } from "@/app/lab/[code]/actions";
import { IDLE } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { START, TitrationFields } from "@/app/lab/[code]/titration-fields";
import type { TitrationValues } from "@/app/lab/[code]/titration-fields";
import { TitrationWorking } from "@/app/lab/[code]/titration-working";
import { SampleSizeHelper } from "@/app/lab/[code]/sample-size-helper";
import { FormMessage } from "@/app/_ui/kit/form-message";

/** A titration as the lab takes it; the acid value and FFA are worked out on screen before saving. */
export function TitrationForm({
  lotCode,
  recorded,
}: {
  lotCode: string;
  recorded: ReadonlyArray<{ basis: string; ffaPct: number }>;
}) {
  const [state, action, pending] = useActionState<FormState, FormData>(recordTitrationAction, IDLE);
  const [values, setValues] = useState<TitrationValues>(START);

  useEffect(() => {
    if (state.seq > 0) setValues((v) => ({ ...v, ...state.values }));
  }, [state]);

  const errors = state.status === "refused" ? state.errors : {};
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
      <TitrationFields values={values} errors={errors} onChange={(n, v) => setValues((old) => ({ ...old, [n]: v }))} />
      <TitrationWorking values={values} recorded={recorded} />
      <SampleSizeHelper
        onUse={(sampleMassG, concentrationMolL) => setValues((v) => ({ ...v, sampleMassG, concentrationMolL }))}
      />
      <FormMessage state={state} />
      <button type="submit" className="primary" disabled={pending}>
        {pending ? "Saving…" : "Save titration"}
      </button>
    </form>
  );
}
