"use client";
import Link from "next/link";
import { useActionState } from "react";
import { receivePickupsAction } from "@/app/receiving/actions";
import type { ReceiveState } from "@/app/receiving/actions";

export interface ReceivingRow {
  code: string;
  day: string;
  observed: string;
  source: string;
  material: string;
  collector: string;
  containers: number;
  volume: string;
  mass: string;
}

const START: ReceiveState = { status: "idle", message: null, values: { code: "", volume: "", temp: "", notes: "", certified: false, pickups: [], tankCode: "", acceptReason: "" }, errors: {}, seq: 0 };

function Err({ state, field }: { state: ReceiveState; field: string }) {
  const m = state.errors[field];
  return m ? (
    <span className="collect-field-error" id={`err-${field}`} role="alert">
      {m}
    </span>
  ) : null;
}

export interface TankOption {
  code: string;
  label: string;
}

export function ReceiveForm({ rows, suggestedCode, mayReceive, tanks }: { rows: ReceivingRow[]; suggestedCode: string; mayReceive: boolean; tanks: readonly TankOption[] }) {
  const [state, action, pending] = useActionState(receivePickupsAction, START);
  const v = state.values;
  const days = [...new Set(rows.map((r) => r.day))];
  const bad = (f: string) => (state.errors[f] ? { "aria-invalid": true as const, "aria-describedby": `err-${f}` } : {});
  return (
    <form action={action} key={state.seq} noValidate>
      {state.message ? (
        <p className={state.status === "saved" ? "collect-saved" : "form-error"} role={state.status === "saved" ? "status" : "alert"}>
          {state.message}
        </p>
      ) : null}
      {rows.length === 0 ? (
        <p className="empty">Every pickup is already in a lot.</p>
      ) : (
        <>
          <fieldset>
            <legend>Pickups not yet in a lot — choose one for its own lot, or several to pool them</legend>
            <Err state={state} field="pickups" />
            {days.map((d) => (
              <div key={d} className="receiving-group">
                <h2>Observed {d}</h2>
                <div className="table-wrap">
                  <table>
                    <thead>
                      <tr>
                        <th scope="col">Take</th>
                        <th scope="col">Pickup</th>
                        <th scope="col">Observed</th>
                        <th scope="col">Source</th>
                        <th scope="col">Material</th>
                        <th scope="col">Collector</th>
                        <th scope="col" className="num">
                          Containers
                        </th>
                        <th scope="col" className="num">
                          Volume
                        </th>
                        <th scope="col" className="num">
                          Est. mass
                        </th>
                      </tr>
                    </thead>
                    <tbody>
                      {rows
                        .filter((r) => r.day === d)
                        .map((r) => (
                          <tr key={r.code}>
                            <td>
                              <input type="checkbox" name="pickup" value={r.code} defaultChecked={v.pickups.includes(r.code)} aria-label={`Take pickup ${r.code}`} />
                            </td>
                            <td>
                              <Link href={`/pickups/${encodeURIComponent(r.code)}`}>{r.code}</Link>
                            </td>
                            <td className="nowrap">{r.observed}</td>
                            <td>{r.source}</td>
                            <td>{r.material}</td>
                            <td>{r.collector}</td>
                            <td className="num">{r.containers}</td>
                            <td className="num">{r.volume}</td>
                            <td className="num">{r.mass}</td>
                          </tr>
                        ))}
                    </tbody>
                  </table>
                </div>
              </div>
            ))}
          </fieldset>
          <fieldset>
            <legend>The plant&apos;s measurement of the lot</legend>
            <label className="collect-field">
              Lot number
              <input name="code" defaultValue={v.code || suggestedCode} autoCapitalize="characters" {...bad("code")} />
              <Err state={state} field="code" />
            </label>
            <label className="collect-field">
              Measured volume (L)
              <input name="volume" inputMode="decimal" defaultValue={v.volume} {...bad("volume")} />
              <Err state={state} field="volume" />
            </label>
            <label className="collect-field">
              Temperature at measurement (°C)
              <input name="temp" inputMode="decimal" defaultValue={v.temp} {...bad("temp")} />
              <Err state={state} field="temp" />
            </label>
            <label className="collect-field">
              <input type="checkbox" name="certified" defaultChecked={v.certified} /> Certified sustainable (every pickup&apos;s source holds a valid certificate)
            </label>
            <label className="collect-field">
              Notes
              <input name="notes" defaultValue={v.notes} maxLength={500} {...bad("notes")} />
              <Err state={state} field="notes" />
            </label>
          </fieldset>
          <fieldset>
            <legend>Where the lot goes</legend>
            <label className="collect-field">
              Pool into
              <select name="tankCode" defaultValue={v.tankCode} {...bad("tankCode")}>
                <option value="">Keep as a lot awaiting the lab (the usual way)</option>
                {tanks.map((t) => (
                  <option key={t.code} value={t.code}>
                    Straight into tank {t.label}
                  </option>
                ))}
              </select>
              <Err state={state} field="tankCode" />
            </label>
            <p className="muted">
              Straight into a tank, the lot is accepted now, by you, and all of it is moved into the tank in the same step. Say why it may be accepted before its own lab result (for example &quot;tank sample titrated&quot;); the reason is kept in the record&apos;s history. If the tank cannot take it, nothing is received.
            </p>
            <label className="collect-field">
              Reason for accepting now (only when pooling into a tank)
              <input name="acceptReason" defaultValue={v.acceptReason} maxLength={200} {...bad("acceptReason")} />
              <Err state={state} field="acceptReason" />
            </label>
          </fieldset>
          <button type="submit" className="primary" disabled={pending || !mayReceive}>
            {pending ? "Receiving…" : "Receive as one lot"}
          </button>
          {!mayReceive ? <p className="muted">Only production staff receive pickups into lots.</p> : null}
        </>
      )}
    </form>
  );
}
