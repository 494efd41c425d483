"use client";
import { createContext, useActionState, useContext, useId } from "react";
import type { ReactNode } from "react";
import { IDLE } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";

const FormStateContext = createContext<FormState>(IDLE);

/**
 * A form posted to a server action. After a refusal the form is drawn again with exactly what was
 * typed and each message beside its field; after a save it starts empty (or keeps the values when
 * `keepValues`). Nothing typed is lost on a refusal.
 */
export function ActionForm({
  action,
  submitLabel,
  hidden = {},
  children,
  label,
  className = "kit-form",
  keepValues = false,
  disabled = false,
}: {
  action: (prev: FormState, form: FormData) => Promise<FormState>;
  submitLabel: string;
  hidden?: Record<string, string>;
  children: ReactNode;
  /** The form's accessible name. */
  label: string;
  className?: string;
  keepValues?: boolean;
  /** The submit button is shown but cannot be used (a role that may read but not record). */
  disabled?: boolean;
}) {
  const [state, act, pending] = useActionState<FormState, FormData>(action, IDLE);
  const shown: FormState = state.status === "saved" && !keepValues ? { ...state, values: {} } : state;
  return (
    <form action={act} noValidate key={state.seq} className={className} aria-label={label}>
      {Object.entries(hidden).map(([k, v]) => (
        <input key={k} type="hidden" name={k} value={v} />
      ))}
      <FormStateContext value={shown}>{children}</FormStateContext>
      <div className="form-actions">
        <button type="submit" className="primary" disabled={pending || disabled}>
          {pending ? "Saving…" : submitLabel}
        </button>
      </div>
      {state.status === "saved" && state.message ? (
        <p className="form-ok" role="status">
          {state.message}
        </p>
      ) : null}
      {state.status === "refused" && state.message ? (
        <p className="form-error" role="alert">
          {state.message}
        </p>
      ) : null}
    </form>
  );
}

/** What the surrounding ActionForm shows: after a refusal, the typed values and the messages (for fields drawn by hand). */
export function useActionFormState(): FormState {
  return useContext(FormStateContext);
}

type FieldProps = {
  name: string;
  label: string;
  unit?: string;
  hint?: ReactNode;
  defaultValue?: string;
  required?: boolean;
  /** The schema's own text limit, so a browser cannot send more than the field takes. */
  maxLength?: number;
} & (
  | {
      type?: "text" | "number" | "datetime-local" | "date";
      options?: undefined;
      placeholder?: string;
      suggestions?: readonly string[];
    }
  | { type: "password"; options?: undefined; autoComplete: "current-password" | "new-password" }
  | { type: "select"; options: ReadonlyArray<readonly [value: string, label: string]> }
  | { type: "textarea"; options?: undefined; placeholder?: string }
  | { type: "checkbox"; options?: undefined }
);

/** A labelled field inside an ActionForm: hint, the kept value after a refusal, and its message. */
export function Field(props: FieldProps) {
  const state = useContext(FormStateContext);
  const id = useId();
  const { name, label, unit, hint, required } = props;
  const kept = state.values[name];
  const value = kept ?? props.defaultValue ?? "";
  const error = state.status === "refused" ? state.errors[name] : undefined;
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-err` : null].filter(Boolean).join(" ") || undefined;
  const common = {
    id,
    name,
    "aria-invalid": error ? true : undefined,
    "aria-describedby": describedBy,
    required,
  } as const;
  const maxLength = props.maxLength;
  let control: ReactNode;
  if (props.type === "select") {
    control = (
      <select {...common} defaultValue={value}>
        {props.options.map(([v, l]) => (
          <option key={v} value={v}>
            {l}
          </option>
        ))}
      </select>
    );
  } else if (props.type === "textarea") {
    control = (
      <textarea {...common} defaultValue={value} rows={3} placeholder={props.placeholder} maxLength={maxLength} />
    );
  } else if (props.type === "password") {
    // A password is never sent back to the page: after a refusal it is typed again.
    control = (
      <input {...common} type="password" defaultValue="" autoComplete={props.autoComplete} maxLength={maxLength} />
    );
  } else if (props.type === "checkbox") {
    control = <input {...common} type="checkbox" value="yes" defaultChecked={value === "yes" || value === "on"} />;
  } else {
    // Numbers are typed as text so that what was typed (a comma, a unit left in) comes back as it was.
    const numeric = props.type === "number";
    const listId = props.suggestions ? `${id}-list` : undefined;
    control = (
      <>
        <input
          {...common}
          type={numeric ? "text" : (props.type ?? "text")}
          inputMode={numeric ? "decimal" : undefined}
          defaultValue={value}
          placeholder={props.placeholder}
          autoComplete="off"
          maxLength={maxLength}
          list={listId}
        />
        {props.suggestions ? (
          <datalist id={listId}>
            {props.suggestions.map((s) => (
              <option key={s} value={s} />
            ))}
          </datalist>
        ) : null}
      </>
    );
  }
  return (
    <div className={`field${props.type === "checkbox" ? " field-check" : ""}`}>
      <label htmlFor={id}>
        {label}
        {unit ? <span className="unit"> ({unit})</span> : null}
      </label>
      {control}
      {hint ? (
        <span className="field-hint" id={`${id}-hint`}>
          {hint}
        </span>
      ) : null}
      {error ? (
        <span className="field-error" id={`${id}-err`}>
          {error}
        </span>
      ) : null}
    </div>
  );
}
