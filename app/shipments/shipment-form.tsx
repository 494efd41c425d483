"use client";
import { useState } from "react";
import { ActionForm, Field, useActionFormState } from "@/app/_ui/kit/action-form";
import { recordShipmentAction } from "@/app/shipments/actions";
import { lineCountOf, lineFieldNames } from "@/app/shipments/form-fields";
import { MAX_SHIPMENT_LINES } from "@/lib/shipment/shipment.schema";

export interface ShipmentFormDefaults {
  shippedAt: string;
  customerCode?: string;
  from?: { kind: "PRODUCT_LOT" | "TANK"; code: string };
}

const SOURCE_KINDS = [
  ["PRODUCT_LOT", "Product lot"],
  ["TANK", "Product tank"],
] as const;
const UNITS = [
  ["kg", "kg"],
  ["L", "litres"],
] as const;

/** The loading lines; after a refusal as many lines come back as were sent, with what was typed. */
function Lines({ from }: { from: ShipmentFormDefaults["from"] }) {
  const state = useActionFormState();
  const [count, setCount] = useState(() => (state.values.lineCount ? lineCountOf(state.values.lineCount) : 1));
  return (
    <fieldset className="shipment-lines">
      <legend>What was loaded</legend>
      <input type="hidden" name="lineCount" value={count} />
      {Array.from({ length: count }, (_, i) => {
        const n = i + 1;
        const [kind, code, qty, unit, temp] = lineFieldNames(n);
        return (
          <fieldset key={n} className="shipment-line" aria-label={`Line ${n}`}>
            <legend>Line {n}</legend>
            <Field
              name={kind}
              label="Loaded from"
              type="select"
              options={SOURCE_KINDS}
              defaultValue={n === 1 && from ? from.kind : "PRODUCT_LOT"}
            />
            <Field
              name={code}
              label="Lot or tank number"
              defaultValue={n === 1 && from ? from.code : ""}
              hint="A released product lot, or a finished fuel tank"
            />
            <Field name={qty} label="Quantity" type="number" />
            <Field name={unit} label="Unit" type="select" options={UNITS} defaultValue="kg" />
            <Field
              name={temp}
              label="Temperature"
              unit="°C"
              type="number"
              hint="Needed for litres: the mass is worked out from the fuel's density at this temperature"
            />
          </fieldset>
        );
      })}
      <div className="line-buttons">
        {count < MAX_SHIPMENT_LINES ? (
          <button type="button" onClick={() => setCount(count + 1)}>
            Add a line
          </button>
        ) : null}
        {count > 1 ? (
          <button type="button" onClick={() => setCount(count - 1)}>
            Remove line {count}
          </button>
        ) : null}
      </div>
    </fieldset>
  );
}

/** Records a shipment: who it goes to, the document and the vehicle, and one or more loading lines. */
export function RecordShipmentForm({
  customers,
  defaults,
}: {
  customers: ReadonlyArray<{ code: string; name: string }>;
  defaults: ShipmentFormDefaults;
}) {
  const options: Array<readonly [string, string]> = [
    ["", "Choose a customer…"],
    ...customers.map((c) => [c.code, `${c.name} (${c.code})`] as const),
  ];
  return (
    <ActionForm action={recordShipmentAction} submitLabel="Record the shipment" label="Record a shipment">
      <Field
        name="customerCode"
        label="Customer"
        type="select"
        options={options}
        defaultValue={defaults.customerCode ?? ""}
      />
      <Field name="documentNo" label="Document number" hint="The number on the shipping document, e.g. BOL-0420" />
      <Field
        name="shippedAt"
        label="Shipped"
        type="datetime-local"
        defaultValue={defaults.shippedAt}
        hint="Site time"
      />
      <Field name="vehicle" label="Vehicle" hint="Tanker or trailer registration" />
      <Field name="compartment" label="Compartment(s)" />
      <Lines from={defaults.from} />
      <Field name="certifiedClaim" label="Shipped with a certified sustainability claim" type="checkbox" />
      <Field name="note" label="Note" type="textarea" />
    </ActionForm>
  );
}
