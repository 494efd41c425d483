"use client";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { changeThresholdAction } from "@/app/screening/thresholds/actions";

/** One threshold at a time: which, its new value, and why the site departs from (or returns to) the default. */
export function ThresholdForm({ options }: { options: ReadonlyArray<readonly [string, string]> }) {
  return (
    <ActionForm action={changeThresholdAction} submitLabel="Save the threshold" label="Change a threshold" keepValues>
      <Field name="setting" label="Threshold" type="select" options={options} required />
      <Field
        name="value"
        label="New value"
        type="number"
        hint="In the threshold's own unit (see the table); the default's value returns it to the default"
        required
      />
      <Field name="reason" label="Reason" hint="Why this site sets its own value" required />
    </ActionForm>
  );
}
