"use client";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { correctBatchOutputAction } from "@/app/batches/[code]/record/actions";

/** Production corrects a finished batch's output typed wrong: the right mass and the reason, never an edit. */
export function CorrectOutputForm({
  batchCode,
  outputs,
}: {
  batchCode: string;
  outputs: ReadonlyArray<readonly [value: string, label: string]>;
}) {
  return (
    <ActionForm
      action={correctBatchOutputAction}
      submitLabel="Record the correction"
      label="Correct an output"
      hidden={{ batchCode }}
    >
      <Field name="movementId" label="Output typed wrong" type="select" options={outputs} />
      <Field name="massKg" label="Right mass" unit="kg" type="number" hint="What the scale or gauge actually showed." />
      <Field
        name="reason"
        label="Reason"
        maxLength={300}
        hint="What was wrong, e.g. digits swapped when typing the ticket."
      />
    </ActionForm>
  );
}
