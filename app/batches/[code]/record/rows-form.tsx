"use client";
import { startTransition, useActionState, useState } from "react";
import { formatFixed } from "@/lib/quantity/units";
import { completeBatchAction, startBatchAction } from "@/app/batches/[code]/record/actions";
import { IDLE, toNumber } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";

export interface ChargeRow {
  fromKind: string;
  fromCode: string;
  role: string;
  massKg: string;
}

export interface OutputRow {
  role: string;
  toKind: string;
  toCode: string;
  massKg: string;
}

const CHARGE_ROLES: Array<[string, string]> = [
  ["OIL", "Oil"],
  ["METHANOL", "Methanol"],
  ["CATALYST", "Catalyst"],
  ["ACID", "Acid"],
  ["WATER", "Water"],
];
const FROM_KINDS: Array<[string, string]> = [
  ["LOT", "Feedstock lot"],
  ["TANK", "Tank"],
  ["REAGENT_LOT", "Reagent lot"],
];
const OUTPUT_ROLES: Array<[string, string]> = [
  ["ESTER", "Ester"],
  ["GLYCEROL_PHASE", "Glycerol phase"],
  ["WASH_WATER", "Wash water"],
  ["RECOVERED_METHANOL", "Recovered methanol"],
  ["LOSS", "Loss"],
];
const TO_KINDS: Array<[string, string]> = [
  ["PRODUCT_LOT", "New product lot"],
  ["WASTE_CONTAINER", "Waste container"],
  ["TANK", "Tank"],
  ["", "— (loss)"],
];

function sumKg(rows: ReadonlyArray<{ massKg: string }>): number {
  return rows.reduce((s, r) => {
    const n = toNumber(r.massKg);
    return s + (n !== undefined && Number.isFinite(n) ? n : 0);
  }, 0);
}

function Message({ state }: { state: FormState }) {
  if (!state.message) return null;
  return (
    <p className={state.status === "saved" ? "form-ok" : "form-error"} role={state.status === "saved" ? "status" : "alert"}>
      {state.message}
    </p>
  );
}

function Err({ state, name }: { state: FormState; name: string }) {
  const m = state.status === "refused" ? state.errors[name] : undefined;
  return m ? <span className="field-error">{m}</span> : null;
}

export function StartForm({ batchCode, initial }: { batchCode: string; initial: ChargeRow[] }) {
  const [state, action, pending] = useActionState<FormState, FormData>(startBatchAction, IDLE);
  const [rows, setRows] = useState<ChargeRow[]>(initial.length > 0 ? initial : [{ fromKind: "TANK", fromCode: "", role: "OIL", massKg: "" }]);
  const set = (i: number, key: keyof ChargeRow) => (e: { target: { value: string } }) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, [key]: e.target.value } : r)));
  const total = sumKg(rows);
  return (
    <form
      className="lab-form"
      noValidate
      aria-label="Record the start"
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        startTransition(() => action(data));
      }}
    >
      <input type="hidden" name="batchCode" value={batchCode} />
      <table className="rows-table">
        <thead>
          <tr>
            <th scope="col">Charge</th>
            <th scope="col">Drawn from</th>
            <th scope="col">Code</th>
            <th scope="col">Mass (kg)</th>
            <th scope="col" />
          </tr>
        </thead>
        <tbody>
          {rows.map((r, i) => (
            <tr key={i}>
              <td>
                <select name={`charges.${i}.role`} value={r.role} onChange={set(i, "role")} aria-label={`Charge ${i + 1}`}>
                  {CHARGE_ROLES.map(([v, l]) => (
                    <option key={v} value={v}>
                      {l}
                    </option>
                  ))}
                </select>
              </td>
              <td>
                <select name={`charges.${i}.fromKind`} value={r.fromKind} onChange={set(i, "fromKind")} aria-label={`Drawn from, row ${i + 1}`}>
                  {FROM_KINDS.map(([v, l]) => (
                    <option key={v} value={v}>
                      {l}
                    </option>
                  ))}
                </select>
              </td>
              <td>
                <input name={`charges.${i}.fromCode`} value={r.fromCode} onChange={set(i, "fromCode")} aria-label={`Code, row ${i + 1}`} aria-invalid={state.errors[`charges.${i}.fromCode`] ? true : undefined} />
                <Err state={state} name={`charges.${i}.fromCode`} />
              </td>
              <td>
                <input name={`charges.${i}.massKg`} value={r.massKg} inputMode="decimal" onChange={set(i, "massKg")} aria-label={`Mass in kg, row ${i + 1}`} aria-invalid={state.errors[`charges.${i}.massKg`] ? true : undefined} />
                <Err state={state} name={`charges.${i}.massKg`} />
              </td>
              <td>
                <button type="button" className="secondary" onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))} aria-label={`Remove row ${i + 1}`}>
                  Remove
                </button>
              </td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <td colSpan={3}>Total charged</td>
            <td className="num">{formatFixed(total, 3)} kg</td>
            <td />
          </tr>
        </tfoot>
      </table>
      <Err state={state} name="charges" />
      <div className="button-row">
        <button type="button" className="secondary" onClick={() => setRows((rs) => [...rs, { fromKind: "REAGENT_LOT", fromCode: "", role: "METHANOL", massKg: "" }])}>
          Add a row
        </button>
        <button type="submit" className="primary" disabled={pending}>
          {pending ? "Recording…" : "Record the start"}
        </button>
      </div>
      <Message state={state} />
    </form>
  );
}

export function FinishForm({ batchCode, chargedKg, initial }: { batchCode: string; chargedKg: number; initial: OutputRow[] }) {
  const [state, action, pending] = useActionState<FormState, FormData>(completeBatchAction, IDLE);
  const [rows, setRows] = useState<OutputRow[]>(initial);
  const set = (i: number, key: keyof OutputRow) => (e: { target: { value: string } }) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, [key]: e.target.value } : r)));
  const total = sumKg(rows);
  const left = chargedKg - total;
  return (
    <form
      className="lab-form"
      noValidate
      aria-label="Record the finish"
      onSubmit={(e) => {
        e.preventDefault();
        const data = new FormData(e.currentTarget);
        startTransition(() => action(data));
      }}
    >
      <input type="hidden" name="batchCode" value={batchCode} />
      <table className="rows-table">
        <thead>
          <tr>
            <th scope="col">Output</th>
            <th scope="col">Goes to</th>
            <th scope="col">Code</th>
            <th scope="col">Mass (kg)</th>
            <th scope="col" />
          </tr>
        </thead>
        <tbody>
          {rows.map((r, i) => (
            <tr key={i}>
              <td>
                <select name={`outputs.${i}.role`} value={r.role} onChange={set(i, "role")} aria-label={`Output ${i + 1}`}>
                  {OUTPUT_ROLES.map(([v, l]) => (
                    <option key={v} value={v}>
                      {l}
                    </option>
                  ))}
                </select>
              </td>
              <td>
                <select name={`outputs.${i}.toKind`} value={r.toKind} onChange={set(i, "toKind")} aria-label={`Goes to, row ${i + 1}`}>
                  {TO_KINDS.map(([v, l]) => (
                    <option key={v} value={v}>
                      {l}
                    </option>
                  ))}
                </select>
              </td>
              <td>
                <input name={`outputs.${i}.toCode`} value={r.toCode} onChange={set(i, "toCode")} aria-label={`Destination code, row ${i + 1}`} aria-invalid={state.errors[`outputs.${i}.toCode`] ? true : undefined} />
                <Err state={state} name={`outputs.${i}.toCode`} />
              </td>
              <td>
                <input name={`outputs.${i}.massKg`} value={r.massKg} inputMode="decimal" onChange={set(i, "massKg")} aria-label={`Output mass in kg, row ${i + 1}`} aria-invalid={state.errors[`outputs.${i}.massKg`] ? true : undefined} />
                <Err state={state} name={`outputs.${i}.massKg`} />
              </td>
              <td>
                <button type="button" className="secondary" onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))} aria-label={`Remove output row ${i + 1}`}>
                  Remove
                </button>
              </td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <td colSpan={3}>Outputs recorded / charged</td>
            <td className="num">
              {formatFixed(total, 3)} / {formatFixed(chargedKg, 3)} kg
            </td>
            <td />
          </tr>
          <tr>
            <td colSpan={3}>Still to account for</td>
            <td className={`num ${Math.abs(left) < 0.0005 ? "" : "over-under"}`} data-testid="left-to-account">
              {formatFixed(left, 3)} kg
            </td>
            <td />
          </tr>
        </tfoot>
      </table>
      <Err state={state} name="outputs" />
      <div className="button-row">
        <button type="button" className="secondary" onClick={() => setRows((rs) => [...rs, { role: "LOSS", toKind: "", toCode: "", massKg: "" }])}>
          Add a row
        </button>
        <button type="submit" className="primary" disabled={pending}>
          {pending ? "Recording…" : "Record the finish"}
        </button>
      </div>
      <Message state={state} />
    </form>
  );
}
