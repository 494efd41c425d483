"use client";
import { startTransition, useActionState } from "react";
import { recordLabTestAction } from "@/app/lab/[code]/actions";
import { IDLE } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";

const METHOD_HINTS = ["Karl Fischer (lab SOP W-2)", "Karl Fischer, coulometric", "Oven loss at 105 °C", "Insolubles by filtration (lab SOP)", "Unsaponifiable matter (lab SOP)"];

export function LabTestForm({ lotCode }: { lotCode: string }) {
  const [state, action, pending] = useActionState<FormState, FormData>(recordLabTestAction, IDLE);
  const v = state.values;
  const err = (name: string) => (state.status === "refused" ? state.errors[name] : undefined);
  const aria = (name: string) => ({ "aria-invalid": err(name) ? true : undefined, "aria-describedby": err(name) ? `lt-${name}-err` : undefined });
  return (
    <form
      className="lab-form"
      noValidate
      aria-labelledby="test-form-h"
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        startTransition(() => action(data));
      }}
    >
      <input type="hidden" name="lotCode" value={lotCode} />
      <div className="lab-grid" key={state.status === "saved" ? state.seq : "typing"}>
        <div className="field">
          <label>
            Test
            <select name="kind" defaultValue={v.kind ?? "WATER"} {...aria("kind")}>
              <option value="WATER">Water</option>
              <option value="INSOLUBLES">Insolubles</option>
              <option value="UNSAPONIFIABLES">Unsaponifiables</option>
            </select>
          </label>
          {err("kind") ? <span className="field-error" id="lt-kind-err">{err("kind")}</span> : null}
        </div>
        <div className="field">
          <label>
            Method
            <input name="method" list="lab-methods" defaultValue={v.method ?? "Karl Fischer (lab SOP W-2)"} {...aria("method")} />
          </label>
          {err("method") ? <span className="field-error" id="lt-method-err">{err("method")}</span> : null}
        </div>
        <div className="field">
          <label>
            Result (% by mass)
            <input name="valuePct" inputMode="decimal" autoComplete="off" defaultValue={v.valuePct ?? ""} {...aria("valuePct")} />
          </label>
          {err("valuePct") ? <span className="field-error" id="lt-valuePct-err">{err("valuePct")}</span> : null}
        </div>
      </div>
      <datalist id="lab-methods">
        {METHOD_HINTS.map((m) => (
          <option key={m} value={m} />
        ))}
      </datalist>
      {state.message ? (
        <p className={state.status === "saved" ? "form-ok" : "form-error"} role={state.status === "saved" ? "status" : "alert"}>
          {state.message}
        </p>
      ) : null}
      <button type="submit" className="primary" disabled={pending}>
        {pending ? "Saving…" : "Save result"}
      </button>
    </form>
  );
}
