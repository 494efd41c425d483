"use client";
// The pickup form on the collector's phone: source, material, containers, volume or gauge reading,
// temperature, quick looks, labels and notes.
import { Cautions } from "@/app/_ui/kit/cautions";
import type { FormEvent } from "react";
import { labelOf } from "@/lib/core/vocabulary";
import { temperatureUnit, volumeUnit } from "@/lib/collect/entry";
import { LOOKS, MAX_CONTAINERS } from "@/lib/feedstock/pickup.schema";
import type { UnitSystem } from "@/lib/quantity/units";
import { formatFixed } from "@/lib/quantity/units";
import type { PhoneSource } from "@/app/collect/types";
import type { FieldErrors } from "@/app/collect/collect-bits";
import { History, invalidProps, Problem } from "@/app/collect/collect-bits";
import { lookText, num } from "@/app/collect/collect-text";
import type { Draft } from "@/app/collect/use-draft";
import { gaugeVolumeOf } from "@/app/collect/use-draft";

type SetField = <K extends keyof Draft>(k: K, v: Draft[K]) => void;
interface Fields {
  draft: Draft;
  set: SetField;
  errors: FieldErrors;
  system: UnitSystem;
}

function SourceField({
  draft,
  errors,
  sources,
  routeCodes,
  onChoose,
}: Pick<Fields, "draft" | "errors"> & {
  sources: PhoneSource[];
  routeCodes: ReadonlySet<string>;
  onChoose: (code: string) => void;
}) {
  return (
    <label className="collect-field">
      Source
      <input
        id="field-sourceCode"
        list="collect-sources"
        value={draft.sourceCode}
        onChange={(e) => onChoose(e.target.value)}
        placeholder="Tap a stop above or type the source code"
        autoCapitalize="characters"
        autoComplete="off"
        {...invalidProps(errors, "sourceCode")}
      />
      <datalist id="collect-sources">
        {sources.map((s) => (
          <option key={s.code} value={s.code}>
            {s.name}
            {routeCodes.has(s.code) ? " (on today's route)" : ""}
          </option>
        ))}
      </datalist>
      <Problem field="sourceCode" errors={errors} />
    </label>
  );
}

function SourceCard({
  source,
  system,
  timeZone,
  today,
}: {
  source: PhoneSource;
  system: UnitSystem;
  timeZone: string;
  today: string;
}) {
  return (
    <div className="collect-source" aria-label={`About ${source.name}`}>
      <p className="collect-source-name">
        <strong>{source.name}</strong>
        <br />
        <span className="muted">{source.address || "no address on file"}</span>
      </p>
      {source.collectorNote ? (
        <p className="collect-note">
          <strong>Note for the collector:</strong> {source.collectorNote}
        </p>
      ) : null}
      <details>
        <summary>Recent pickups here ({source.history.length})</summary>
        <History rows={source.history} system={system} tz={timeZone} today={today} />
      </details>
    </div>
  );
}

/** The cautions at the kerb: hot, heavy oil always; hydrogen sulfide when the material is trap grease. */
function PickupCautions({ material }: { material: string }) {
  return (
    <Cautions
      title="Cautions at the pickup"
      items={[
        "Used oil can be hot and containers heavy and slippery. Do not pour or lift hot oil; wear gloves and eye protection.",
        ...(material === "TRAP_GREASE"
          ? [
              "Trap grease gives off hydrogen sulfide, which can kill and which you soon stop smelling. Never enter or lean into a grease trap or pit; stand upwind, keep the lid open only as long as needed, and pump from outside.",
            ]
          : []),
      ]}
    />
  );
}

function MaterialField({
  materials,
  material,
  set,
  errors,
}: Pick<Fields, "set" | "errors"> & { materials: string[]; material: string }) {
  return (
    <label className="collect-field">
      Material
      <select
        id="field-material"
        value={material}
        onChange={(e) => set("material", e.target.value)}
        {...invalidProps(errors, "material")}
      >
        {materials.map((m) => (
          <option key={m} value={m}>
            {labelOf(m)}
          </option>
        ))}
      </select>
      <Problem field="material" errors={errors} />
    </label>
  );
}

function ContainersField({ draft, set, errors }: Pick<Fields, "draft" | "set" | "errors">) {
  return (
    <div className="collect-field">
      <label htmlFor="field-containers">Containers</label>
      <div className="collect-stepper">
        <button
          type="button"
          aria-label="One container fewer"
          onClick={() => set("containers", String(Math.max(1, (num(draft.containers) || 1) - 1)))}
        >
          −
        </button>
        <input
          id="field-containers"
          inputMode="numeric"
          value={draft.containers}
          onChange={(e) => set("containers", e.target.value)}
          max={MAX_CONTAINERS}
          {...invalidProps(errors, "containers")}
        />
        <button
          type="button"
          aria-label="One container more"
          onClick={() => set("containers", String((num(draft.containers) || 0) + 1))}
        >
          +
        </button>
      </div>
      <Problem field="containers" errors={errors} />
    </div>
  );
}

function MeasureFields({ draft, set, errors, system }: Fields) {
  const vu = volumeUnit(system);
  const gaugeVolume = gaugeVolumeOf(draft);
  return (
    <>
      <fieldset className="collect-choice">
        <legend>Measure by</legend>
        <label>
          <input
            type="radio"
            name="measure"
            checked={draft.measure === "volume"}
            onChange={() => set("measure", "volume")}
          />{" "}
          Volume
        </label>
        <label>
          <input
            type="radio"
            name="measure"
            checked={draft.measure === "gauge"}
            onChange={() => set("measure", "gauge")}
          />{" "}
          Gauge reading
        </label>
      </fieldset>
      {draft.measure === "volume" ? (
        <label className="collect-field">
          Volume ({vu}, all containers)
          <input
            id="field-volumeL"
            inputMode="decimal"
            value={draft.volume}
            onChange={(e) => set("volume", e.target.value)}
            {...invalidProps(errors, "volumeL")}
          />
          <Problem field="volumeL" errors={errors} />
        </label>
      ) : (
        <div className="collect-field" id="field-gauge" tabIndex={-1}>
          <label>
            Container size ({vu})
            <input
              inputMode="decimal"
              value={draft.gaugeSize}
              onChange={(e) => set("gaugeSize", e.target.value)}
              {...invalidProps(errors, "gauge")}
            />
          </label>
          <label>
            Fill level on the gauge (%)
            <input
              inputMode="decimal"
              value={draft.gaugeFill}
              onChange={(e) => set("gaugeFill", e.target.value)}
              {...invalidProps(errors, "gauge")}
            />
          </label>
          <span className="muted">= {Number.isFinite(gaugeVolume) ? `${formatFixed(gaugeVolume, 1)} ${vu}` : "—"}</span>
          <Problem field="gauge" errors={errors} />
        </div>
      )}
    </>
  );
}

function LookFields({ draft, set, errors }: Pick<Fields, "draft" | "set" | "errors">) {
  return (
    <>
      {(["waterLook", "solidsLook"] as const).map((f) => (
        <fieldset key={f} className="collect-choice" id={`field-${f}`}>
          <legend>{f === "waterLook" ? "Water (a quick look)" : "Solids (a quick look)"}</legend>
          {LOOKS.map((l) => (
            <label key={l}>
              <input type="radio" name={f} checked={draft[f] === l} onChange={() => set(f, l)} /> {lookText(l)}
            </label>
          ))}
          <Problem field={f} errors={errors} />
        </fieldset>
      ))}
    </>
  );
}

function TextFields({ draft, set, errors, system }: Fields) {
  return (
    <>
      <label className="collect-field">
        Oil temperature ({temperatureUnit(system)})
        <input
          id="field-tempC"
          inputMode="decimal"
          value={draft.temp}
          onChange={(e) => set("temp", e.target.value)}
          {...invalidProps(errors, "tempC")}
        />
        <Problem field="tempC" errors={errors} />
      </label>
      <LookFields draft={draft} set={set} errors={errors} />
      <label className="collect-field">
        Container labels (optional, one per container)
        <input
          id="field-containerTags"
          value={draft.tags}
          onChange={(e) => set("tags", e.target.value)}
          autoCapitalize="characters"
          placeholder="e.g. C-0012 C-0013"
          {...invalidProps(errors, "containerTags")}
        />
        <Problem field="containerTags" errors={errors} />
      </label>
      <label className="collect-field">
        Notes
        <textarea
          id="field-notes"
          value={draft.notes}
          onChange={(e) => set("notes", e.target.value)}
          rows={2}
          maxLength={500}
          {...invalidProps(errors, "notes")}
        />
        <Problem field="notes" errors={errors} />
      </label>
    </>
  );
}

export interface PickupFormProps extends Fields {
  sources: PhoneSource[];
  routeCodes: ReadonlySet<string>;
  source: PhoneSource | undefined;
  materials: string[];
  material: string;
  timeZone: string;
  today: string;
  editing: boolean;
  mayRecord: boolean;
  boxReady: boolean;
  saved: string | null;
  onChooseSource: (code: string) => void;
  onSubmit: (ev: FormEvent) => Promise<void>;
  onStopEditing: () => void;
}

export function PickupForm(p: PickupFormProps) {
  const fields: Fields = { draft: p.draft, set: p.set, errors: p.errors, system: p.system };
  return (
    <form
      id="collect-form"
      className="collect-form"
      onSubmit={(e) => void p.onSubmit(e)}
      noValidate
      aria-labelledby="form-h"
    >
      <h2 id="form-h">{p.editing ? "Fix the refused pickup" : "New pickup"}</h2>
      <SourceField
        draft={p.draft}
        errors={p.errors}
        sources={p.sources}
        routeCodes={p.routeCodes}
        onChoose={p.onChooseSource}
      />
      {p.source ? <SourceCard source={p.source} system={p.system} timeZone={p.timeZone} today={p.today} /> : null}
      {p.materials.length > 1 ? (
        <MaterialField materials={p.materials} material={p.material} set={p.set} errors={p.errors} />
      ) : null}
      <PickupCautions material={p.material} />
      <ContainersField {...fields} />
      <MeasureFields {...fields} />
      <TextFields {...fields} />
      <Problem field="form" errors={p.errors} />
      <Problem field="observedAt" errors={p.errors} />
      <Problem field="code" errors={p.errors} />
      <button type="submit" className="collect-primary" disabled={!p.boxReady || !p.mayRecord}>
        {p.editing ? "Save the corrected pickup" : "Save pickup"}
      </button>
      {p.editing ? (
        <button type="button" className="collect-secondary" onClick={p.onStopEditing}>
          Stop editing
        </button>
      ) : null}
      {p.saved ? (
        <p className="collect-saved" role="status">
          {p.saved}
        </p>
      ) : null}
    </form>
  );
}
