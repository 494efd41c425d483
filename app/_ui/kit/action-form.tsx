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

type ControlAttrs = {
  id: string;
  name: string;
  "aria-invalid": true | undefined;
  "aria-describedby": string | undefined;
  required: boolean | undefined;
};

/** A text input with its suggestions. Numbers are typed as text so that what was typed (a comma, a unit left in) comes back as it was. */
function TextControl({
  attrs,
  value,
  type,
  placeholder,
  maxLength,
  suggestions,
}: {
  attrs: ControlAttrs;
  value: string;
  type: "text" | "number" | "datetime-local" | "date" | undefined;
  placeholder: string | undefined;
  maxLength: number | undefined;
  suggestions: readonly string[] | undefined;
}) {
  const numeric = type === "number";
  const listId = suggestions ? `${attrs.id}-list` : undefined;
  return (
    <>
      <input
        {...attrs}
        type={numeric ? "text" : (type ?? "text")}
        inputMode={numeric ? "decimal" : undefined}
        defaultValue={value}
        placeholder={placeholder}
        autoComplete="off"
        maxLength={maxLength}
        list={listId}
      />
      {suggestions ? (
        <datalist id={listId}>
          {suggestions.map((s) => (
            <option key={s} value={s} />
          ))}
        </datalist>
      ) : null}
    </>
  );
}

/** The input, select or text area a field's type asks for, holding the value to show. */
function Control({ props, attrs, value }: { props: FieldProps; attrs: ControlAttrs; value: string }) {
  const maxLength = props.maxLength;
  switch (props.type) {
    case "select":
      return (
        <select {...attrs} defaultValue={value}>
          {props.options.map(([v, l]) => (
            <option key={v} value={v}>
              {l}
            </option>
          ))}
        </select>
      );
    case "textarea":
      return (
        <textarea {...attrs} defaultValue={value} rows={3} placeholder={props.placeholder} maxLength={maxLength} />
      );
    case "password":
      // A password is never sent back to the page: after a refusal it is typed again.
      return (
        <input {...attrs} type="password" defaultValue="" autoComplete={props.autoComplete} maxLength={maxLength} />
      );
    case "checkbox":
      return <input {...attrs} type="checkbox" value="yes" defaultChecked={value === "yes" || value === "on"} />;
    default:
      return (
        <TextControl
          attrs={attrs}
          value={value}
          type={props.type}
          placeholder={props.placeholder}
          maxLength={maxLength}
          suggestions={props.suggestions}
        />
      );
  }
}

/** A labelled field inside an ActionForm: hint, the kept value after a refusal, and its message. */
export function Field(props: FieldProps) {
  const state = useContext(FormStateContext);
  const id = useId();
  const { name, label, unit, hint, required } = props;
  const value = state.values[name] ?? props.defaultValue ?? "";
  const error = state.status === "refused" ? state.errors[name] : undefined;
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-err` : null].filter(Boolean).join(" ") || undefined;
  const attrs: ControlAttrs = {
    id,
    name,
    "aria-invalid": error ? true : undefined,
    "aria-describedby": describedBy,
    required,
  };
  return (
    <div className={`field${props.type === "checkbox" ? " field-check" : ""}`}>
      <label htmlFor={id}>
        {label}
        {unit ? <span className="unit"> ({unit})</span> : null}
      </label>
      <Control props={props} attrs={attrs} value={value} />
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
