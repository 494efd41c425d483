"use client";
import { startTransition, useActionState } from "react";
import { decideLotAction } from "@/app/lab/[code]/actions";
import { IDLE } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { FormMessage } from "@/app/_ui/kit/form-message";

export function DecisionForm({ lotCode, titrations }: { lotCode: string; titrations: number }) {
  const [state, action, pending] = useActionState<FormState, FormData>(decideLotAction, IDLE);
  const decide = (status: "ACCEPTED" | "REJECTED") => () => {
    const data = new FormData();
    data.set("lotCode", lotCode);
    data.set("status", status);
    startTransition(() => action(data));
  };
  return (
    <div className="lab-form" role="group" aria-label="Decision">
      <p className="note">
        {titrations === 0
          ? "Accepting needs at least one FFA titration; a lot can be rejected at any time while it waits."
          : `${titrations} valid titration${titrations === 1 ? "" : "s"} recorded. An accepted lot can be drawn into tanks and batches.`}
      </p>
      <div className="button-row">
        <button type="button" className="primary" disabled={pending} onClick={decide("ACCEPTED")}>
          Accept lot
        </button>
        <button type="button" className="danger" disabled={pending} onClick={decide("REJECTED")}>
          Reject lot
        </button>
      </div>
      <FormMessage state={state} />
    </div>
  );
}
