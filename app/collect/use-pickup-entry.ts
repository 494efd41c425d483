"use client";
// Saving a pickup to the phone's outbox, fixing a refused one, and discarding one: the form's actions.
import { useState } from "react";
import type { FormEvent, RefObject } from "react";
import type { OutboxEntry } from "@/lib/collect/outbox";
import { newEntry } from "@/lib/collect/outbox";
import type { Outbox } from "@/lib/collect/outbox-idb";
import { checkOnPhone, pickupNumber } from "@/lib/collect/entry";
import type { UnitSystem } from "@/lib/quantity/units";
import type { FieldErrors } from "@/app/collect/collect-bits";
import { localParts } from "@/app/collect/collect-text";
import type { Draft } from "@/app/collect/use-draft";
import { draftFromEntry, EMPTY, errorsByField, pickupInputOf } from "@/app/collect/use-draft";
import type { DistanceBand } from "@/lib/core/vocabulary";

interface EntryContext {
  box: RefObject<Outbox | null>;
  entries: OutboxEntry[];
  user: { userId: number; login: string; fullName: string; unitSystem: UnitSystem };
  timeZone: string;
  known: ReadonlySet<string>;
  draft: Draft;
  setDraft: (d: Draft | ((d: Draft) => Draft)) => void;
  material: string;
  refresh: () => Promise<void>;
  flush: () => Promise<void>;
  announce: () => void;
  /** The distance band from the chosen stop, when the collector agreed to share it (never the position). */
  bandFor: (stop: { lat: number; lon: number } | null) => Promise<DistanceBand | undefined>;
  stop: { lat: number; lon: number } | null;
}

/** Keeps an entry in the phone's outbox; a message naming what went wrong, or null when kept. */
async function keepOnPhone(box: Outbox, entry: OutboxEntry, editing: boolean): Promise<string | null> {
  try {
    if (editing) await box.replace(entry);
    else await box.add(entry);
    return null;
  } catch (e) {
    return `Could not keep the entry on this phone: ${e instanceof Error ? e.message : String(e)}. Nothing was cleared.`;
  }
}

/** The pickup as typed: a fix keeps its number, time and distance band; a new one gets them now. */
async function pickupInputFor(c: EntryContext, editing: OutboxEntry | undefined) {
  const key = editing?.key ?? crypto.randomUUID();
  const observedAt = editing?.pickup.observedAt ?? new Date().toISOString();
  const code = editing?.pickup.code ?? pickupNumber(localParts(new Date(observedAt), c.timeZone).day, key);
  const input = pickupInputOf(c.draft, { code, observedAt, key, material: c.material, system: c.user.unitSystem });
  if (editing?.pickup.phoneDistanceBand) input.phoneDistanceBand = editing.pickup.phoneDistanceBand;
  else if (!editing) {
    const band = await c.bandFor(c.stop);
    if (band) input.phoneDistanceBand = band;
  }
  return { input, code };
}

export function usePickupEntry(c: EntryContext) {
  const [editingKey, setEditingKey] = useState<string | null>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [saved, setSaved] = useState<string | null>(null);

  function chooseSource(code: string) {
    c.setDraft((d) => ({ ...d, sourceCode: code, material: "" }));
    setErrors((e) => ({ ...e, sourceCode: [] }));
    setSaved(null);
  }

  async function keep(entry: OutboxEntry, editing: boolean): Promise<boolean> {
    const box = c.box.current;
    if (!box) return false;
    const problem = await keepOnPhone(box, entry, editing);
    if (problem !== null) setErrors({ form: [problem] });
    return problem === null;
  }

  async function save(ev: FormEvent) {
    ev.preventDefault();
    if (!c.box.current) return;
    const editing = editingKey ? c.entries.find((e) => e.key === editingKey) : undefined;
    const { input, code } = await pickupInputFor(c, editing);
    const checked = checkOnPhone(input, c.known);
    if (!checked.ok) {
      const byField = errorsByField(checked.issues, c.draft.measure);
      setErrors(byField);
      setSaved(null);
      document.getElementById(`field-${Object.keys(byField)[0]}`)?.focus();
      return;
    }
    const pickup = { ...input, sourceCode: checked.value.sourceCode, material: checked.value.material };
    const entry = editing
      ? { ...editing, pickup, state: "WAITING" as const, refusal: null, lastProblem: null }
      : newEntry(pickup, { userId: c.user.userId, login: c.user.login, fullName: c.user.fullName }, new Date());
    if (!(await keep(entry, editing !== undefined))) return;
    setErrors({});
    setEditingKey(null);
    c.announce();
    setSaved(`Pickup ${code} kept on this phone — it is sent as soon as there is a connection.`);
    c.setDraft((d) => ({ ...EMPTY, sourceCode: "", measure: d.measure, gaugeSize: d.gaugeSize }));
    await c.refresh();
    void c.flush();
  }

  function edit(e: OutboxEntry) {
    c.setDraft(draftFromEntry(e, c.user.unitSystem));
    setErrors(errorsByField(e.refusal ?? []));
    setEditingKey(e.key);
    document.getElementById("field-sourceCode")?.focus();
  }

  async function discard(e: OutboxEntry) {
    if (
      !window.confirm(
        `Discard pickup ${e.pickup.code} from ${e.pickup.sourceCode}? It was never stored on the server and cannot be recovered.`,
      )
    )
      return;
    await c.box.current?.discard(e.key);
    await c.refresh();
    c.announce();
  }

  function stopEditing() {
    setEditingKey(null);
    setErrors({});
    c.setDraft(EMPTY);
  }

  return { editingKey, errors, saved, chooseSource, save, edit, discard, stopEditing };
}
