"use client";
import { startTransition, useActionState } from "react";
import { recordPlanAction } from "@/app/plan/actions";
import { IDLE } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";

export function RecordPlanForm({ query, suggestedCode }: { query: string; suggestedCode: string }) {
  const [state, action, pending] = useActionState<FormState, FormData>(recordPlanAction, IDLE);
  const err = (name: string) => (state.status === "refused" ? state.errors[name] : undefined);
  return (
    <form
      className="lab-form no-print"
      noValidate
      aria-label="Record as planned"
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        startTransition(() => action(data));
      }}
    >
      <input type="hidden" name="query" value={query} />
      <div className="lab-grid">
        <div className="field">
          <label>
            Batch number
            <input
              name="code"
              defaultValue={state.values.code ?? suggestedCode}
              autoComplete="off"
              aria-invalid={err("code") ? true : undefined}
              aria-describedby={err("code") ? "rp-code-err" : undefined}
            />
          </label>
          {err("code") ? (
            <span className="field-error" id="rp-code-err">
              {err("code")}
            </span>
          ) : null}
        </div>
        <div className="field wide">
          <label>
            Notes
            <input
              name="notes"
              defaultValue={state.values.notes ?? ""}
              autoComplete="off"
              aria-invalid={err("notes") ? true : undefined}
            />
          </label>
          {err("notes") ? <span className="field-error">{err("notes")}</span> : null}
        </div>
      </div>
      <p className="note">
        The draws are proposed again from the stock at the moment you record, so a change in stock since this page
        loaded is taken into account.
      </p>
      {state.status === "refused" && state.message ? (
        <p className="form-error" role="alert">
          {state.message}
        </p>
      ) : null}
      <button type="submit" className="primary" disabled={pending}>
        {pending ? "Recording…" : "Record as planned"}
      </button>
    </form>
  );
}
