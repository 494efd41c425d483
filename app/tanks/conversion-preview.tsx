"use client";
import { useEffect, useRef, useState } from "react";
import { massOfVolume } from "@/lib/tank/strapping";
import type { DensityEntry } from "@/lib/quantity/density";

function numberIn(form: HTMLFormElement, name: string): number | undefined {
  const el = form.elements.namedItem(name);
  if (!(el instanceof HTMLInputElement)) return undefined;
  const t = el.value.trim();
  if (t === "") return undefined;
  const n = Number(/^-?\d+,\d+$/.test(t) ? t.replace(",", ".") : t);
  return Number.isFinite(n) ? n : undefined;
}

/**
 * Shows, as the worker types, what a volume read at a temperature weighs with the density the server
 * will use (the same pure function): V × ρ(t). The server computes it again when the form is sent.
 */
export function ConversionPreview({
  entry,
  densityKgM3,
  referenceTempC,
  basis,
}: {
  entry: DensityEntry;
  densityKgM3?: number;
  referenceTempC?: number;
  basis: string;
}) {
  const ref = useRef<HTMLParagraphElement>(null);
  const [text, setText] = useState<string | null>(null);
  useEffect(() => {
    const form = ref.current?.closest("form");
    if (!form) return;
    const update = () => {
      const volumeL = numberIn(form, "volumeL");
      const tempC = numberIn(form, "tempC");
      if (volumeL === undefined || tempC === undefined || volumeL <= 0) return setText(null);
      const m = massOfVolume({
        volumeL,
        tempC,
        entry,
        ...(densityKgM3 === undefined ? {} : { densityKgM3, referenceTempC: referenceTempC ?? 15 }),
      });
      if (!m.ok) return setText(null);
      const rho = m.value.densityKgM3;
      setText(
        `${volumeL.toLocaleString("en")} L at ${tempC} °C × ${rho.toFixed(1)} kg/m³ = ${m.value.massKg.toLocaleString("en", { maximumFractionDigits: 1 })} kg`,
      );
    };
    update();
    form.addEventListener("input", update);
    return () => form.removeEventListener("input", update);
  }, [entry, densityKgM3, referenceTempC]);
  return (
    <p className="field-wide conversion" ref={ref} aria-live="polite">
      <strong>Volume to mass:</strong> {text ?? "type a volume and its temperature to see the mass"}.{" "}
      <span className="muted">{basis}</span>
    </p>
  );
}
