"use client";
import { useActionState, useId } from "react";
import type { ReactNode } from "react";
import { changeUserAction, createUserAction, endSessionsAction, resetPasswordAction, unlockSignInAction } from "@/app/admin/users/actions";
import { IDLE } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";

const ROLE_WORDS: ReadonlyArray<readonly [string, string]> = [
  ["COLLECTOR", "Collector"],
  ["PRODUCTION", "Production"],
  ["COMPLIANCE", "Compliance"],
  ["ADMIN", "Administrator"],
];

type Action = (prev: FormState, form: FormData) => Promise<FormState>;

function Field({ state, name, label, children }: { state: FormState; name: string; label: string; children: (p: { id: string; invalid: boolean; describedBy: string | undefined }) => ReactNode }) {
  const id = useId();
  const error = state.errors[name];
  return (
    <label htmlFor={id} className="account-field">
      {label}
      {children({ id, invalid: error !== undefined, describedBy: error ? `${id}-err` : undefined })}
      {error ? (
        <span id={`${id}-err`} className="field-error">
          {error}
        </span>
      ) : null}
    </label>
  );
}

function Answer({ state }: { state: FormState }) {
  if (!state.message) return null;
  return (
    <p className={state.status === "saved" ? "form-ok" : "form-error"} role={state.status === "saved" ? "status" : "alert"}>
      {state.message}
    </p>
  );
}

// Each answer remounts its form (key = answer number), so the fields show the values the server
// handed back — what the user typed after a refusal, empty after a save.
function useForm(action: Action) {
  return useActionState<FormState, FormData>(action, IDLE);
}

export function CreateAccountForm() {
  const [state, act, pending] = useForm(createUserAction);
  const v = (n: string) => state.values[n] ?? "";
  return (
    <form action={act} className="account-form" noValidate key={state.seq} aria-label="New account">
      <Field state={state} name="login" label="User name">
        {(p) => <input id={p.id} name="login" defaultValue={v("login")} autoComplete="off" aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy} />}
      </Field>
      <Field state={state} name="fullName" label="Full name">
        {(p) => <input id={p.id} name="fullName" defaultValue={v("fullName")} aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy} />}
      </Field>
      <Field state={state} name="role" label="Role">
        {(p) => (
          <select id={p.id} name="role" defaultValue={v("role") || "COLLECTOR"} aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy}>
            {ROLE_WORDS.map(([r, w]) => (
              <option key={r} value={r}>
                {w}
              </option>
            ))}
          </select>
        )}
      </Field>
      <Field state={state} name="unitSystem" label="Units">
        {(p) => (
          <select id={p.id} name="unitSystem" defaultValue={v("unitSystem") || "metric"}>
            <option value="metric">Metric (kg, L, °C)</option>
            <option value="us">US (lb, gal, °F)</option>
          </select>
        )}
      </Field>
      <Field state={state} name="password" label="First password">
        {(p) => <input id={p.id} name="password" type="password" autoComplete="new-password" aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy} />}
      </Field>
      <button type="submit" disabled={pending}>
        {pending ? "Saving…" : "Create account"}
      </button>
      <Answer state={state} />
    </form>
  );
}

/** Role, units and active state of one account; every change needs a reason. */
export function ChangeAccountForm({ login, role, active, unitSystem }: { login: string; role: string; active: boolean; unitSystem: string }) {
  const [state, act, pending] = useForm(changeUserAction);
  return (
    <form action={act} className="account-form" noValidate key={state.seq} aria-label={`Change ${login}`}>
      <input type="hidden" name="login" value={login} />
      <Field state={state} name="role" label="Role">
        {(p) => (
          <select id={p.id} name="role" defaultValue={state.values.role ?? role} aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy}>
            {ROLE_WORDS.map(([r, w]) => (
              <option key={r} value={r}>
                {w}
              </option>
            ))}
          </select>
        )}
      </Field>
      <Field state={state} name="active" label="Account">
        {(p) => (
          <select id={p.id} name="active" defaultValue={state.values.active ?? (active ? "yes" : "no")} aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy}>
            <option value="yes">Active</option>
            <option value="no">Disabled (sessions end now)</option>
          </select>
        )}
      </Field>
      <Field state={state} name="unitSystem" label="Units">
        {(p) => (
          <select id={p.id} name="unitSystem" defaultValue={state.values.unitSystem ?? unitSystem}>
            <option value="metric">Metric</option>
            <option value="us">US</option>
          </select>
        )}
      </Field>
      <Field state={state} name="reason" label="Reason">
        {(p) => <input id={p.id} name="reason" defaultValue={state.values.reason ?? ""} aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy} />}
      </Field>
      <button type="submit" disabled={pending}>
        Save change
      </button>
      <Answer state={state} />
    </form>
  );
}

export function ResetPasswordForm({ login }: { login: string }) {
  const [state, act, pending] = useForm(resetPasswordAction);
  return (
    <form action={act} className="account-form" noValidate key={state.seq} aria-label={`New password for ${login}`}>
      <input type="hidden" name="login" value={login} />
      <Field state={state} name="password" label="New password">
        {(p) => <input id={p.id} name="password" type="password" autoComplete="new-password" aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy} />}
      </Field>
      <Field state={state} name="reason" label="Reason">
        {(p) => <input id={p.id} name="reason" defaultValue={state.values.reason ?? ""} aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy} />}
      </Field>
      <button type="submit" disabled={pending}>
        Set password
      </button>
      <Answer state={state} />
    </form>
  );
}

export function EndSessionsForm({ login }: { login: string }) {
  const [state, act, pending] = useForm(endSessionsAction);
  return (
    <form action={act} className="account-form" noValidate key={state.seq} aria-label={`End sessions of ${login}`}>
      <input type="hidden" name="login" value={login} />
      <Field state={state} name="reason" label="Reason">
        {(p) => <input id={p.id} name="reason" defaultValue={state.values.reason ?? ""} aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy} />}
      </Field>
      <button type="submit" disabled={pending}>
        End all sessions
      </button>
      <Answer state={state} />
    </form>
  );
}

/** Lifts a sign-in lock after failed attempts (for example a colleague who forgot the password and then remembered). */
export function UnlockSignInForm({ login }: { login: string }) {
  const [state, act, pending] = useForm(unlockSignInAction);
  return (
    <form action={act} className="account-form" noValidate key={state.seq} aria-label={`Unlock sign-in of ${login}`}>
      <input type="hidden" name="login" value={login} />
      <Field state={state} name="reason" label="Reason">
        {(p) => <input id={p.id} name="reason" defaultValue={state.values.reason ?? ""} aria-invalid={p.invalid || undefined} aria-describedby={p.describedBy} />}
      </Field>
      <button type="submit" disabled={pending}>
        Unlock sign-in
      </button>
      <Answer state={state} />
    </form>
  );
}
