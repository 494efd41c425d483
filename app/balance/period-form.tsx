"use client";
import { useActionState, useId } from "react";
import { closePeriodAction, reopenPeriodAction } from "@/app/balance/period-actions";
import type { PeriodActionState } from "@/app/balance/period-actions";

const INITIAL: PeriodActionState = { ok: false, message: null, field: null, reason: "" };

/** Close or reopen one accounting period; a reopen needs a reason, and both are recorded with who and when. */
export function PeriodActionForm({
  periodId,
  action,
  periodLabel,
}: {
  periodId: number;
  action: "close" | "reopen";
  periodLabel: string;
}) {
  const [state, formAction, pending] = useActionState<PeriodActionState, FormData>(
    action === "close" ? closePeriodAction : reopenPeriodAction,
    INITIAL,
  );
  const id = useId();
  const invalid = !state.ok && state.message !== null && (state.field === "reason" || state.field === null);
  return (
    <form action={formAction} className="period-action" noValidate>
      <input type="hidden" name="periodId" value={periodId} />
      <label htmlFor={`${id}-reason`}>
        {action === "close"
          ? `Note for closing ${periodLabel} (optional)`
          : `Reason for reopening ${periodLabel} (required)`}
        <input
          id={`${id}-reason`}
          name="reason"
          size={44}
          maxLength={500}
          defaultValue={state.reason}
          key={state.ok ? "done" : state.reason}
          required={action === "reopen"}
          aria-invalid={invalid && state.field === "reason" ? true : undefined}
          aria-describedby={state.message ? `${id}-msg` : undefined}
        />
      </label>
      <button type="submit" disabled={pending}>
        {pending ? "Saving…" : action === "close" ? `Close ${periodLabel}` : `Reopen ${periodLabel}`}
      </button>
      {state.message ? (
        <p id={`${id}-msg`} className={state.ok ? "form-ok" : "form-error"} role={state.ok ? "status" : "alert"}>
          {state.message}
        </p>
      ) : null}
    </form>
  );
}
