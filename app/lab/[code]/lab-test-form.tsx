"use client";
import { recordLabTestAction } from "@/app/lab/[code]/actions";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";

const METHOD_HINTS = [
  "Karl Fischer (lab SOP W-2)",
  "Karl Fischer, coulometric",
  "Oven loss at 105 °C",
  "Insolubles by filtration (lab SOP)",
  "Unsaponifiable matter (lab SOP)",
];
const TESTS: ReadonlyArray<readonly [string, string]> = [
  ["WATER", "Water"],
  ["INSOLUBLES", "Insolubles"],
  ["UNSAPONIFIABLES", "Unsaponifiables"],
];

export function LabTestForm({ lotCode }: { lotCode: string }) {
  return (
    <ActionForm
      action={recordLabTestAction}
      label="Record a test result"
      submitLabel="Save result"
      hidden={{ lotCode }}
    >
      <Field name="kind" label="Test" type="select" options={TESTS} defaultValue="WATER" />
      <Field name="method" label="Method" defaultValue="Karl Fischer (lab SOP W-2)" suggestions={METHOD_HINTS} />
      <Field name="valuePct" label="Result" unit="% by mass" type="number" />
    </ActionForm>
  );
}
