"use client";
import type { DistanceBand } from "@/lib/core/vocabulary";
// The pickup form as typed: survives a reload in localStorage (the outbox itself lives in IndexedDB),
// and turns into the body the outbox sends.
import { useEffect, useRef, useState } from "react";
import type { OutboxEntry } from "@/lib/collect/outbox";
import { celsiusFrom, litresFrom, volumeFromGauge, volumeUnit } from "@/lib/collect/entry";
import type { LOOKS } from "@/lib/feedstock/pickup.schema";
import type { UnitSystem } from "@/lib/quantity/units";
import { celsiusToFahrenheit, convertVolume } from "@/lib/quantity/units";
import { num } from "@/app/collect/collect-text";
import type { FieldErrors } from "@/app/collect/collect-bits";

const DRAFT_KEY = "tracevat-collect-draft";

export interface Draft {
  sourceCode: string;
  material: string;
  containers: string;
  measure: "volume" | "gauge";
  volume: string;
  gaugeSize: string;
  gaugeFill: string;
  temp: string;
  waterLook: (typeof LOOKS)[number];
  solidsLook: (typeof LOOKS)[number];
  tags: string;
  notes: string;
}

export const EMPTY: Draft = {
  sourceCode: "",
  material: "",
  containers: "1",
  measure: "volume",
  volume: "",
  gaugeSize: "",
  gaugeFill: "",
  temp: "",
  waterLook: "NONE",
  solidsLook: "NONE",
  tags: "",
  notes: "",
};

export function useDraft() {
  const [draft, setDraft] = useState<Draft>(EMPTY);
  const draftLoaded = useRef(false);
  useEffect(() => {
    try {
      const raw = window.localStorage.getItem(DRAFT_KEY);
      if (raw) setDraft({ ...EMPTY, ...(JSON.parse(raw) as Partial<Draft>) });
    } catch {
      /* a broken draft is ignored; the outbox is untouched */
    }
    draftLoaded.current = true;
  }, []);
  useEffect(() => {
    if (!draftLoaded.current) return;
    try {
      window.localStorage.setItem(DRAFT_KEY, JSON.stringify(draft));
    } catch {
      /* storage full: the form still holds the values */
    }
  }, [draft]);
  const set = <K extends keyof Draft>(k: K, v: Draft[K]) => setDraft((d) => ({ ...d, [k]: v }));
  return { draft, setDraft, set };
}

export function gaugeVolumeOf(draft: Draft): number {
  return volumeFromGauge(num(draft.containers), num(draft.gaugeSize), num(draft.gaugeFill));
}

/** The body the outbox sends, from the form as typed (checked afterwards by checkOnPhone). */
export function pickupInputOf(
  draft: Draft,
  at: { code: string; observedAt: string; key: string; material: string; system: UnitSystem },
): PhonePickupInput {
  const gaugeVolume = gaugeVolumeOf(draft);
  const tags = draft.tags
    .split(/[\s,;]+/)
    .map((t) => t.trim())
    .filter(Boolean);
  const gaugeNote =
    draft.measure === "gauge" && Number.isFinite(gaugeVolume)
      ? `gauge: ${draft.containers} × ${draft.gaugeSize} ${volumeUnit(at.system)} at ${draft.gaugeFill} %`
      : "";
  return {
    code: at.code,
    sourceCode: draft.sourceCode.trim().toUpperCase(),
    material: at.material,
    observedAt: at.observedAt,
    containers: num(draft.containers),
    containerTags: tags,
    volumeL: litresFrom(draft.measure === "gauge" ? gaugeVolume : num(draft.volume), at.system),
    tempC: celsiusFrom(num(draft.temp), at.system),
    waterLook: draft.waterLook,
    solidsLook: draft.solidsLook,
    notes: [gaugeNote, draft.notes.trim()].filter(Boolean).join("; "),
    idempotencyKey: at.key,
  };
}

/** What the phone keeps for one pickup; the distance band is added only when the collector shares it. */
export interface PhonePickupInput {
  code: string;
  sourceCode: string;
  material: string;
  observedAt: string;
  containers: number;
  containerTags: string[];
  volumeL: number;
  tempC: number;
  waterLook: Draft["waterLook"];
  solidsLook: Draft["solidsLook"];
  notes: string;
  idempotencyKey: string;
  phoneDistanceBand?: DistanceBand;
}

/** Messages by form field; a volume problem shows at the gauge fields when measuring by gauge. */
export function errorsByField(
  issues: ReadonlyArray<{ field?: string | null; message: string }>,
  measure: Draft["measure"] = "volume",
): FieldErrors {
  const byField: FieldErrors = {};
  for (const i of issues) {
    const f = (i.field ?? "form").split(".")[0] ?? "form";
    const target = f === "volumeL" && measure === "gauge" ? "gauge" : f;
    (byField[target] ??= []).push(i.message);
  }
  return byField;
}

/** A refused entry back in the form, in the collector's units. */
export function draftFromEntry(e: OutboxEntry, system: UnitSystem): Draft {
  const p = e.pickup;
  const vol = system === "us" ? convertVolume(p.volumeL, "L", "gal") : p.volumeL;
  const t = system === "us" ? celsiusToFahrenheit(p.tempC) : p.tempC;
  return {
    ...EMPTY,
    sourceCode: p.sourceCode,
    material: p.material,
    containers: String(p.containers),
    volume: String(Math.round(vol * 1000) / 1000),
    temp: String(Math.round(t * 10) / 10),
    waterLook: p.waterLook ?? "NONE",
    solidsLook: p.solidsLook ?? "NONE",
    tags: (p.containerTags ?? []).join(" "),
    notes: p.notes ?? "",
  };
}
