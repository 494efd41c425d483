"use client";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { setClosureToleranceAction, setWaterLimitsAction } from "@/app/limits/actions";

/** The closure tolerance: warn and fail levels as a share of the inputs, with the reason for the change. */
export function ClosureToleranceForm({ current }: { current: { warnPct: number; failPct: number } }) {
  return (
    <ActionForm
      action={setClosureToleranceAction}
      submitLabel="Save the closure tolerance"
      label="Change the closure tolerance"
    >
      <Field
        name="warnPct"
        label="Warn above"
        unit="% of inputs"
        type="number"
        defaultValue={String(current.warnPct)}
        required
      />
      <Field
        name="failPct"
        label="Fail above"
        unit="% of inputs"
        type="number"
        defaultValue={String(current.failPct)}
        required
      />
      <Field
        name="reason"
        label="Reason"
        type="textarea"
        hint="Why the site works to this tolerance: the scheme, the auditor's letter or the site's own procedure"
        required
      />
    </ActionForm>
  );
}

/** The water limit of each reaction step, with the reason for the change. */
export function WaterLimitsForm({ current }: { current: { baseStepPct: number; acidStepPct: number } }) {
  return (
    <ActionForm action={setWaterLimitsAction} submitLabel="Save the water limits" label="Change the water limits">
      <Field
        name="baseStepPct"
        label="Water limit for the base-catalysed step"
        unit="% w/w"
        type="number"
        defaultValue={String(current.baseStepPct)}
        required
      />
      <Field
        name="acidStepPct"
        label="Water limit for the acid step"
        unit="% w/w"
        type="number"
        defaultValue={String(current.acidStepPct)}
        required
      />
      <Field
        name="reason"
        label="Reason"
        type="textarea"
        hint="Why: the catalyst supplier's advice, the site's trials or its procedure"
        required
      />
    </ActionForm>
  );
}
