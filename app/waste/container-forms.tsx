"use client";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import {
  markFullAction,
  openContainerAction,
  recordCharacterisationAction,
  recordHaulAction,
} from "@/app/waste/actions";

/** Open a new waste container: what it will hold, where it stands, when it started filling. */
export function OpenContainerForm({
  streams,
  nowLocal,
}: {
  streams: ReadonlyArray<readonly [string, string]>;
  nowLocal: string;
}) {
  return (
    <ActionForm action={openContainerAction} submitLabel="Open the container" label="Open a container">
      <Field name="code" label="Container code" hint="As written on the drum, tote or bin" required />
      <Field
        name="stream"
        label="Stream"
        type="select"
        options={[["", "Choose what it will hold"], ...streams]}
        required
      />
      <Field name="location" label="Location" hint="Bay, pad or area where it stands" />
      <Field
        name="accumulationStart"
        label="Accumulation start"
        type="datetime-local"
        defaultValue={nowLocal}
        hint="When the first waste went in; the time on site counts from here"
        required
      />
      <Field name="capacityL" label="Capacity" unit="L" type="number" required />
      <Field name="satellite" label="In a satellite accumulation area" type="checkbox" />
    </ActionForm>
  );
}

/** Lab results for the contents; each is optional, at least one is needed. */
export function CharacterisationForm({ containerCode, nowLocal }: { containerCode: string; nowLocal: string }) {
  return (
    <ActionForm
      action={recordCharacterisationAction}
      submitLabel="Record the characterisation"
      label="Record a characterisation"
      hidden={{ containerCode }}
    >
      <Field name="testedAt" label="Test date" type="datetime-local" defaultValue={nowLocal} required />
      <Field name="methanolPct" label="Methanol" unit="% v/v" type="number" />
      <Field name="pH" label="pH" type="number" />
      <Field name="flashPointC" label="Flash point, closed cup" unit="°C" type="number" />
      <Field name="waterPct" label="Water" unit="% by weight" type="number" />
    </ActionForm>
  );
}

export function MarkFullForm({ containerCode, nowLocal }: { containerCode: string; nowLocal: string }) {
  return (
    <ActionForm
      action={markFullAction}
      submitLabel="Mark full"
      label="Mark the container full"
      hidden={{ containerCode }}
    >
      <Field name="fullAt" label="Full on" type="datetime-local" defaultValue={nowLocal} required />
    </ActionForm>
  );
}

/** The hauler's collection under its manifest or shipping document. */
export function HaulForm({ containerCode, nowLocal }: { containerCode: string; nowLocal: string }) {
  return (
    <ActionForm
      action={recordHaulAction}
      submitLabel="Record the haul-away"
      label="Record a haul-away"
      hidden={{ containerCode }}
    >
      <Field name="documentNo" label="Manifest or document number" required />
      <Field name="hauler" label="Hauler" required />
      <Field name="disposedAt" label="Collected" type="datetime-local" defaultValue={nowLocal} required />
      <Field
        name="massKg"
        label="Quantity collected"
        unit="kg"
        type="number"
        hint="From the hauler's weight ticket"
        required
      />
      <Field
        name="destination"
        label="Destination facility"
        hint="Where the hauler takes it for treatment, recycling or disposal"
        required
      />
    </ActionForm>
  );
}
