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

/** One number the planner asks for: its name in the query, its label, what the empty box shows, and its hint. */
export interface PlanInput {
  name: string;
  label: string;
  placeholder?: string;
  hint?: ReactNode;
}

/** A run of planner inputs in the order given, each keeping what was asked and its message. */
export function PlanInputs({
  inputs,
  params,
  errors,
}: {
  inputs: readonly PlanInput[];
  params: SearchParams;
  errors: Record<string, string>;
}) {
  return inputs.map((i) => <Field key={i.name} {...i} params={params} errors={errors} />);
}

/** A planner's choice from a fixed list, kept in the query string, with its message. */
export function PlanChoice({
  name,
  label,
  value,
  options,
  errors,
}: {
  name: string;
  label: string;
  value: string;
  options: ReadonlyArray<readonly [value: string, label: string]>;
  errors: Record<string, string>;
}) {
  return (
    <div className="field">
      <label>
        {label}
        <select name={name} defaultValue={value}>
          {options.map(([v, l]) => (
            <option key={v} value={v}>
              {l}
            </option>
          ))}
        </select>
      </label>
      {errors[name] ? <span className="field-error">{errors[name]}</span> : null}
    </div>
  );
}
