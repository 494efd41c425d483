"use client";
import { useActionState } from "react";
import { setOwnUnitsAction } from "@/app/me/actions";
import { IDLE } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { FormMessage } from "@/app/_ui/kit/form-message";

export function UnitsForm({ current }: { current: string }) {
  const [state, act, pending] = useActionState<FormState, FormData>(setOwnUnitsAction, IDLE);
  return (
    <form action={act} className="account-form" aria-label="Your units" key={state.seq}>
      <fieldset>
        <legend>Units for display and entry</legend>
        <label>
          <input type="radio" name="unitSystem" value="metric" defaultChecked={current !== "us"} /> Metric — kg, litres,
          °C
        </label>
        <label>
          <input type="radio" name="unitSystem" value="us" defaultChecked={current === "us"} /> US — lb, US gallons, °F
        </label>
      </fieldset>
      <button type="submit" disabled={pending}>
        Save
      </button>
      <FormMessage state={state} />
    </form>
  );
}
