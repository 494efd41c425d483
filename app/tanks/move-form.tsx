"use client";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { moveToTankAction } from "@/app/tanks/actions";
import { ConversionPreview } from "@/app/tanks/conversion-preview";
import type { DensityEntry } from "@/lib/quantity/density";

export interface TankChoice {
  code: string;
  label: string;
}

/** Move from a lot or a tank into a tank: a mass, or a volume read at a temperature, or all of it. */
export function MoveForm({
  fromKind,
  fromCode,
  tanks,
  nowLocal,
  density,
  heldText,
  label,
}: {
  fromKind: "LOT" | "TANK";
  fromCode: string;
  tanks: readonly TankChoice[];
  nowLocal: string;
  density: { entry: DensityEntry; densityKgM3?: number; referenceTempC?: number; basis: string };
  heldText: string;
  label: string;
}) {
  return (
    <ActionForm
      action={moveToTankAction}
      submitLabel="Move"
      label={label}
      hidden={{ fromKind, fromCode, shownAt: nowLocal }}
    >
      <Field name="toTankCode" label="Into tank" type="select" options={tanks.map((t) => [t.code, t.label] as const)} />
      <Field name="all" label={`All of it (${heldText})`} type="checkbox" />
      <Field name="massKg" label="Or a mass" unit="kg" type="number" hint="Weighed or metered mass" />
      <Field name="volumeL" label="Or a volume" unit="L" type="number" hint="Volume read on a meter or gauge" />
      <Field
        name="tempC"
        label="Temperature of that volume"
        unit="°C"
        type="number"
        hint="Needed with a volume: warm oil takes more room"
      />
      <ConversionPreview {...density} />
      <Field
        name="at"
        label="Time of the move"
        type="datetime-local"
        defaultValue={nowLocal}
        hint="Site time; now unless the move was earlier"
      />
      <Field name="note" label="Note" type="text" />
    </ActionForm>
  );
}
