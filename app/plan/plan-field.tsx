import type { ReactNode } from "react";
import { firstParam } from "@/app/plan/plan-query";
import type { SearchParams } from "@/app/plan/plan-query";

/** A planner's input kept in the query string, with its message and hint. */
export function Field({
  name,
  label,
  params,
  errors,
  hint,
  placeholder,
}: {
  name: string;
  label: string;
  params: SearchParams;
  errors: Record<string, string>;
  hint?: ReactNode;
  placeholder?: string;
}) {
  const error = errors[name];
  return (
    <div className="field">
      <label>
        {label}
        <input
          name={name}
          inputMode="decimal"
          autoComplete="off"
          defaultValue={firstParam(params, name)}
          placeholder={placeholder}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${name}-err` : undefined}
        />
      </label>
      {error ? (
        <span className="field-error" id={`${name}-err`}>
          {error}
        </span>
      ) : null}
      {hint ? <span className="hint">{hint}</span> : null}
    </div>
  );
}
