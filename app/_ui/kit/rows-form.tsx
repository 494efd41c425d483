"use client";
import { startTransition, useActionState, useState } from "react";
import type { ReactNode } from "react";
import { IDLE } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { FormMessage } from "@/app/_ui/kit/form-message";

/** One row of the form: field key → what is typed or chosen. */
export type RowValues = Record<string, string>;

export interface RowField {
  key: string;
  kind: "select" | "text" | "number";
  options?: ReadonlyArray<readonly [string, string]>;
  /** Accessible name for row i (0-based), e.g. "Mass in kg, row 1". */
  label: (i: number) => string;
  /** A short visible word before the input, when a cell holds more than one field. */
  caption?: string;
  /** Shown (and posted) only for rows this says yes to. */
  showFor?: (row: RowValues) => boolean;
}

export interface RowColumn {
  header: string;
  fields: readonly RowField[];
}

function Err({ state, name }: { state: FormState; name: string }) {
  const m = state.status === "refused" ? state.errors[name] : undefined;
  return m ? <span className="field-error">{m}</span> : null;
}

/** One field of one row, named "<list>.<i>.<field>", with its message after a refusal. */
function RowInput({
  state,
  name,
  field: f,
  value,
  onChange,
  index,
}: {
  state: FormState;
  name: string;
  field: RowField;
  value: string;
  onChange: (e: { target: { value: string } }) => void;
  index: number;
}) {
  const common = {
    name,
    value,
    onChange,
    "aria-label": f.label(index),
    "aria-invalid": state.errors[name] ? true : undefined,
  } as const;
  return (
    <span className="rows-field">
      {f.caption ? <span className="muted">{f.caption} </span> : null}
      {f.kind === "select" ? (
        <select {...common}>
          {(f.options ?? []).map(([v, l]) => (
            <option key={v} value={v}>
              {l}
            </option>
          ))}
        </select>
      ) : (
        <input {...common} {...(f.kind === "number" ? { inputMode: "decimal" as const } : {})} />
      )}
      <Err state={state} name={name} />
    </span>
  );
}

/** The rows as a table: a column per field group, a Remove button per row, the footer drawn from the rows. */
function RowsTable({
  state,
  list,
  columns,
  rows,
  setRows,
  removeLabel,
  footer,
}: {
  state: FormState;
  list: string;
  columns: readonly RowColumn[];
  rows: RowValues[];
  setRows: (update: (rows: RowValues[]) => RowValues[]) => void;
  removeLabel: (i: number) => string;
  footer: (rows: readonly RowValues[]) => ReactNode;
}) {
  const set = (i: number, key: string) => (e: { target: { value: string } }) =>
    setRows((rs) => rs.map((r, j) => (j === i ? { ...r, [key]: e.target.value } : r)));
  return (
    <div className="table-wrap">
      <table className="rows-table">
        <thead>
          <tr>
            {columns.map((c) => (
              <th key={c.header} scope="col">
                {c.header}
              </th>
            ))}
            <th scope="col" />
          </tr>
        </thead>
        <tbody>
          {rows.map((r, i) => (
            <tr key={i}>
              {columns.map((c) => (
                <td key={c.header}>
                  {c.fields
                    .filter((f) => f.showFor === undefined || f.showFor(r))
                    .map((f) => (
                      <RowInput
                        key={f.key}
                        state={state}
                        name={`${list}.${i}.${f.key}`}
                        field={f}
                        value={r[f.key] ?? ""}
                        onChange={set(i, f.key)}
                        index={i}
                      />
                    ))}
                </td>
              ))}
              <td>
                <button
                  type="button"
                  className="secondary"
                  onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))}
                  aria-label={removeLabel(i)}
                >
                  Remove
                </button>
              </td>
            </tr>
          ))}
        </tbody>
        <tfoot>{footer(rows)}</tfoot>
      </table>
    </div>
  );
}

/**
 * A form of rows posted to a server action as "<list>.<i>.<field>": batch charges, batch outputs.
 * Rows can be added and removed; a refusal shows each message beside its field and keeps what was
 * typed; the footer is drawn from the rows as they stand (totals, what is left).
 */
export function RowsForm({
  action,
  list,
  label,
  submitLabel,
  hidden,
  columns,
  initial,
  newRow,
  removeLabel,
  footer,
  after,
}: {
  action: (prev: FormState, form: FormData) => Promise<FormState>;
  /** The rows' name in the posted form, e.g. "charges". */
  list: string;
  /** The form's accessible name and its submit button's words. */
  label: string;
  submitLabel: string;
  hidden: Record<string, string>;
  columns: readonly RowColumn[];
  initial: RowValues[];
  newRow: RowValues;
  removeLabel: (i: number) => string;
  footer: (rows: readonly RowValues[]) => ReactNode;
  /** Drawn under the buttons, with the rows as they stand. */
  after?: (rows: readonly RowValues[]) => ReactNode;
}) {
  const [state, act, pending] = useActionState<FormState, FormData>(action, IDLE);
  const [rows, setRows] = useState<RowValues[]>(initial.length > 0 ? initial : [newRow]);
  return (
    <form
      className="lab-form"
      noValidate
      aria-label={label}
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        startTransition(() => act(data));
      }}
    >
      {Object.entries(hidden).map(([k, v]) => (
        <input key={k} type="hidden" name={k} value={v} />
      ))}
      <RowsTable
        state={state}
        list={list}
        columns={columns}
        rows={rows}
        setRows={setRows}
        removeLabel={removeLabel}
        footer={footer}
      />
      <Err state={state} name={list} />
      <div className="button-row">
        <button type="button" className="secondary" onClick={() => setRows((rs) => [...rs, { ...newRow }])}>
          Add a row
        </button>
        <button type="submit" className="primary" disabled={pending}>
          {pending ? "Recording…" : submitLabel}
        </button>
      </div>
      {after ? after(rows) : null}
      <FormMessage state={state} />
    </form>
  );
}
