"use client";
import { timeSkew } from "@/lib/collect/time-skew";
import type { UnitSystem } from "@/lib/quantity/units";
import type { PhoneHistory } from "@/app/collect/types";
import { lookText, shown, tempText, volumeText } from "@/app/collect/collect-text";

export type FieldErrors = Record<string, string[]>;

export function SkewFlag({ observedAt, receivedAt }: { observedAt: string; receivedAt: string }) {
  const s = timeSkew(new Date(observedAt), new Date(receivedAt));
  if (!s.flag) return null;
  return (
    <span className="skew-flag" data-skew={s.kind}>
      ⚑ {s.message}
    </span>
  );
}

export function History({
  rows,
  system,
  tz,
  today,
}: {
  rows: PhoneHistory[];
  system: UnitSystem;
  tz: string;
  today: string;
}) {
  if (rows.length === 0) return <p className="muted">No pickups here in the last months.</p>;
  return (
    <ul className="collect-history">
      {rows.map((h) => (
        <li key={h.code}>
          <strong>{shown(h.observedAt, tz, today)}</strong> · {h.containers} cont. · {volumeText(h.volumeMl, system)} ·{" "}
          {tempText(h.tempC, system)} · water {lookText(h.waterLook)}, solids {lookText(h.solidsLook)}{" "}
          <span className="muted">({h.collector})</span>{" "}
          <SkewFlag observedAt={h.observedAt} receivedAt={h.receivedAt} />
        </li>
      ))}
    </ul>
  );
}

export function Problem({ field, errors }: { field: string; errors: FieldErrors }) {
  const list = errors[field];
  if (!list?.length) return null;
  return (
    <span className="collect-field-error" id={`err-${field}`} role="alert">
      {list.join("; ")}
    </span>
  );
}

/** aria attributes tying a field to its message, when it has one. */
export function invalidProps(errors: FieldErrors, f: string) {
  return errors[f]?.length ? { "aria-invalid": true as const, "aria-describedby": `err-${f}` } : {};
}
