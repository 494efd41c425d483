"use client";
import { useActionState, useId } from "react";
import { reverseMovementAction, voidLabResultAction } from "@/app/corrections/actions";
import { IDLE } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";

function ReasonForm({
  action,
  hidden,
  label,
  button,
  title,
}: {
  action: (p: FormState, f: FormData) => Promise<FormState>;
  hidden: Record<string, string>;
  label: string;
  button: string;
  title: string;
}) {
  const [state, act, pending] = useActionState<FormState, FormData>(action, IDLE);
  const id = useId();
  const error = state.errors.reason;
  return (
    <details className="correction">
      <summary>{title}</summary>
      {state.status === "saved" ? (
        <p className="form-ok" role="status">
          {state.message}
        </p>
      ) : (
        <form action={act} noValidate key={state.seq} className="correction-form">
          {Object.entries(hidden).map(([k, v]) => (
            <input key={k} type="hidden" name={k} value={v} />
          ))}
          <label htmlFor={`${id}-reason`}>
            {label}
            <input
              id={`${id}-reason`}
              name="reason"
              defaultValue={state.values.reason ?? ""}
              aria-invalid={error ? true : undefined}
              aria-describedby={error ? `${id}-err` : undefined}
            />
          </label>
          {error ? (
            <span id={`${id}-err`} className="field-error">
              {error}
            </span>
          ) : null}
          <button type="submit" disabled={pending}>
            {button}
          </button>
          {state.status === "refused" && state.message && !error ? (
            <p className="form-error" role="alert">
              {state.message}
            </p>
          ) : null}
        </form>
      )}
    </details>
  );
}

/** Cancels a mistaken transfer with a linked opposite movement. */
export function ReverseMovementForm({ movementId }: { movementId: number }) {
  return (
    <ReasonForm
      action={reverseMovementAction}
      hidden={{ movementId: String(movementId) }}
      title={`Reverse No. ${movementId}`}
      label="What was wrong"
      button="Book the reversal"
    />
  );
}

/** Voids a titration or lab test entered by mistake (kept on record, marked, no longer counted). */
export function VoidResultForm({ kind, resultId }: { kind: "TITRATION" | "LAB_TEST"; resultId: number }) {
  return (
    <ReasonForm
      action={voidLabResultAction}
      hidden={{ kind, resultId: String(resultId) }}
      title="Void"
      label="What was wrong"
      button="Void this result"
    />
  );
}

/** Takes back a charge booked by mistake into a batch that is still reacting (a linked opposite movement). */
export function TakeBackChargeForm({ movementId }: { movementId: number }) {
  return (
    <ReasonForm
      action={reverseMovementAction}
      hidden={{ movementId: String(movementId) }}
      title={`Take back No. ${movementId}`}
      label="What was wrong"
      button="Take this charge back"
    />
  );
}
