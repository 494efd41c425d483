import type { FormState } from "@/app/_ui/kit/form-state";

/** A form's answer under its buttons: a saved message read out politely, a refusal at once. */
export function FormMessage({ state }: { state: FormState }) {
  if (!state.message) return null;
  const ok = state.status === "saved";
  return (
    <p className={ok ? "form-ok" : "form-error"} role={ok ? "status" : "alert"}>
      {state.message}
    </p>
  );
}
