"use client";
import type { ReactNode } from "react";
import { useEffect, useRef, useState } from "react";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { recordGaugeAction } from "@/app/tanks/actions";
import { volumeAtLevel } from "@/lib/tank/strapping";
import type { StrappingTable } from "@/lib/tank/strapping";

/** As the level is typed, the volume the calibration table gives (the server reads it again on saving). */
function LevelPreview({ table }: { table: StrappingTable }) {
  const ref = useRef<HTMLParagraphElement>(null);
  const [text, setText] = useState<string | null>(null);
  useEffect(() => {
    const form = ref.current?.closest("form");
    if (!form) return;
    const update = () => {
      const el = form.elements.namedItem("levelMm");
      const method = form.elements.namedItem("method");
      const raw = el instanceof HTMLInputElement ? el.value.trim() : "";
      if (raw === "" || !(method instanceof HTMLSelectElement) || method.value !== "LEVEL") return setText(null);
      const v = volumeAtLevel(table, Number(raw));
      setText(
        v.ok
          ? `${raw} mm → ${v.value.toLocaleString("en", { maximumFractionDigits: 1 })} L by the calibration table`
          : (v.issues[0]?.message ?? null),
      );
    };
    update();
    form.addEventListener("input", update);
    return () => form.removeEventListener("input", update);
  }, [table]);
  return (
    <p className="field-wide conversion" ref={ref} aria-live="polite">
      {text ??
        `Calibration table on file: ${table[0]?.[0] ?? 0}–${table[table.length - 1]?.[0] ?? 0} mm, read in straight lines between its rows.`}
    </p>
  );
}

/** A gauge reading: the volume read directly, or the level through the tank's calibration table. */
export function GaugeForm({
  tankCode,
  nowLocal,
  table,
  densityHint,
}: {
  tankCode: string;
  nowLocal: string;
  table: StrappingTable | null;
  densityHint: ReactNode;
}) {
  return (
    <ActionForm
      action={recordGaugeAction}
      submitLabel="Record reading"
      label="Record a gauge reading"
      hidden={table ? { tankCode, shownAt: nowLocal } : { tankCode, shownAt: nowLocal, method: "VOLUME" }}
    >
      <Field name="at" label="Time of the reading" type="datetime-local" defaultValue={nowLocal} hint="Site time" />
      {table ? (
        <Field
          name="method"
          label="Read as"
          type="select"
          options={[
            ["LEVEL", "Level (mm), by the table"],
            ["VOLUME", "Volume (L), read directly"],
          ]}
        />
      ) : null}
      {table ? (
        <Field name="levelMm" label="Level" unit="mm" type="number" hint="Dip or level gauge, whole millimetres" />
      ) : null}
      <Field
        name="volumeL"
        label={table ? "Or volume read directly" : "Volume read"}
        unit="L"
        type="number"
        hint={table ? "Only when read as a volume" : "This tank has no calibration table on file, so enter the volume"}
      />
      <Field name="tempC" label="Temperature" unit="°C" type="number" />
      <Field
        name="densityKgM3"
        label="Measured density at 15 °C (optional)"
        unit="kg/m³"
        type="number"
        hint={densityHint}
      />
      {table ? <LevelPreview table={table} /> : null}
      <Field name="note" label="Note" type="text" />
    </ActionForm>
  );
}
