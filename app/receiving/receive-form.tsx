"use client";
import Link from "next/link";
import { receivePickupsAction } from "@/app/receiving/actions";
import { ActionForm, Field, useActionFormState } from "@/app/_ui/kit/action-form";
import type { Column } from "@/app/_ui/kit/data-table";
import { DataTable } from "@/app/_ui/kit/data-table";

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

export interface TankOption {
  code: string;
  label: string;
}

/** The waiting pickups, one table per day observed, each with its "take" box (ticked again after a refusal). */
function PickupChoice({ rows }: { rows: ReceivingRow[] }) {
  const state = useActionFormState();
  const taken = new Set((state.values.pickups ?? "").split(",").filter((c) => c !== ""));
  const error = state.status === "refused" ? state.errors.pickups : undefined;
  const days = [...new Set(rows.map((r) => r.day))];
  const columns: Column<ReceivingRow>[] = [
    {
      key: "take",
      header: "Take",
      cell: (r) => (
        <input
          type="checkbox"
          name="pickup"
          value={r.code}
          defaultChecked={taken.has(r.code)}
          aria-label={`Take pickup ${r.code}`}
        />
      ),
    },
    {
      key: "pickup",
      header: "Pickup",
      cell: (r) => <Link href={`/pickups/${encodeURIComponent(r.code)}`}>{r.code}</Link>,
    },
    { key: "observed", header: "Observed", cell: (r) => <span className="nowrap">{r.observed}</span> },
    { key: "source", header: "Source", cell: (r) => r.source },
    { key: "material", header: "Material", cell: (r) => r.material },
    { key: "collector", header: "Collector", cell: (r) => r.collector },
    { key: "containers", header: "Containers", numeric: true, cell: (r) => r.containers },
    { key: "volume", header: "Volume", numeric: true, cell: (r) => r.volume },
    { key: "mass", header: "Est. mass", numeric: true, cell: (r) => r.mass },
  ];
  return (
    <fieldset className="field-wide">
      <legend>Pickups not yet in a lot — choose one for its own lot, or several to pool them</legend>
      {error ? (
        <span className="field-error" id="err-pickups" role="alert">
          {error}
        </span>
      ) : null}
      {days.map((d) => (
        <div key={d} className="receiving-group">
          <h2>Observed {d}</h2>
          <DataTable
            caption={`Pickups observed ${d}`}
            hideCaption
            columns={columns}
            rows={rows.filter((r) => r.day === d)}
            rowKey={(r) => r.code}
            empty="None."
          />
        </div>
      ))}
    </fieldset>
  );
}

export function ReceiveForm({
  rows,
  suggestedCode,
  mayReceive,
  tanks,
}: {
  rows: ReceivingRow[];
  suggestedCode: string;
  mayReceive: boolean;
  tanks: readonly TankOption[];
}) {
  const tankOptions: ReadonlyArray<readonly [string, string]> = [
    ["", "Keep as a lot awaiting the lab (the usual way)"],
    ...tanks.map((t) => [t.code, `Straight into tank ${t.label}`] as const),
  ];
  // The form stays on the page when the last pickup has been received, so its answer is still read.
  const empty = rows.length === 0;
  return (
    <>
      <ActionForm
        action={receivePickupsAction}
        label="Receive pickups as a lot"
        submitLabel="Receive as one lot"
        disabled={!mayReceive || empty}
      >
        {empty ? (
          <p className="empty field-wide">Every pickup is already in a lot.</p>
        ) : (
          <>
            <PickupChoice rows={rows} />
            <Field name="code" label="Lot number" defaultValue={suggestedCode} maxLength={20} />
            <Field name="volume" label="Measured volume" unit="L" type="number" />
            <Field name="temp" label="Temperature at measurement" unit="°C" type="number" />
            <Field
              name="certified"
              label="Certified sustainable (every pickup's source holds a valid certificate)"
              type="checkbox"
            />
            <Field name="notes" label="Notes" maxLength={500} />
            <Field
              name="tankCode"
              label="Pool into"
              type="select"
              options={tankOptions}
              hint="Straight into a tank, the lot is accepted now, by you, and all of it is moved into the tank in the same step; say why it may be accepted before its own lab result (for example “tank sample titrated”) — the reason is kept in the record's history. If the tank cannot take it, nothing is received."
            />
            <Field
              name="acceptReason"
              label="Reason for accepting now (only when pooling into a tank)"
              maxLength={200}
            />
          </>
        )}
      </ActionForm>
      {!mayReceive ? <p className="muted">Only production staff receive pickups into lots.</p> : null}
    </>
  );
}
