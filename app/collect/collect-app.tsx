"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import type { FormEvent } from "react";
import { labelOf } from "@/lib/ledger/kinds";
import type { OutboxEntry } from "@/lib/collect/outbox";
import { SEND_EVERY_MS, STALE_AFTER_MS, newEntry, summarize } from "@/lib/collect/outbox";
import { celsiusFrom, checkOnPhone, litresFrom, pickupNumber, temperatureUnit, volumeFromGauge, volumeUnit } from "@/lib/collect/entry";
import { timeSkew } from "@/lib/collect/time-skew";
import { LOOKS, MAX_CONTAINERS } from "@/lib/feedstock/pickup.schema";
import type { UnitSystem } from "@/lib/quantity/units";
import { celsiusToFahrenheit, convertVolume, formatFixed, formatVolume } from "@/lib/quantity/units";
import type { PhoneData, PhoneHistory, PhoneSource } from "@/app/collect/types";
import { useOutbox } from "@/app/collect/use-outbox";
import { Cautions } from "@/app/_ui/kit/cautions";

const DRAFT_KEY = "tracevat-collect-draft";

interface Draft {
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

const EMPTY: Draft = { sourceCode: "", material: "", containers: "1", measure: "volume", volume: "", gaugeSize: "", gaugeFill: "", temp: "", waterLook: "NONE", solidsLook: "NONE", tags: "", notes: "" };

type FieldErrors = Record<string, string[]>;

function num(s: string): number {
  const t = s.trim().replace(",", ".");
  return t === "" ? Number.NaN : Number(t);
}

function localParts(d: Date, timeZone: string): { day: string; time: string } {
  let f: Intl.DateTimeFormat;
  try {
    f = new Intl.DateTimeFormat("en-GB", { timeZone, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23" });
  } catch {
    f = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23" });
  }
  const p = Object.fromEntries(f.formatToParts(d).map((x) => [x.type, x.value]));
  return { day: `${p.year}-${p.month}-${p.day}`, time: `${p.hour}:${p.minute}` };
}

function shown(iso: string, tz: string, today: string): string {
  const p = localParts(new Date(iso), tz);
  return p.day === today ? `today ${p.time}` : `${p.day} ${p.time}`;
}

function volumeText(ml: number, system: UnitSystem): string {
  return formatVolume(ml, system, { decimals: 1 });
}

function tempText(c: number, system: UnitSystem): string {
  return system === "us" ? `${formatFixed(celsiusToFahrenheit(c), 0)} °F` : `${formatFixed(c, 0)} °C`;
}

function lookText(look: string): string {
  return look === "TRACE" ? "trace" : look === "LAYER" ? "layer" : "none";
}

function SkewFlag({ observedAt, receivedAt }: { observedAt: string; receivedAt: string }) {
  const s = timeSkew(new Date(observedAt), new Date(receivedAt));
  if (!s.flag) return null;
  return (
    <span className="skew-flag" data-skew={s.kind}>
      ⚑ {s.message}
    </span>
  );
}

function History({ rows, system, tz, today }: { rows: PhoneHistory[]; system: UnitSystem; tz: string; today: string }) {
  if (rows.length === 0) return <p className="muted">No pickups here in the last months.</p>;
  return (
    <ul className="collect-history">
      {rows.map((h) => (
        <li key={h.code}>
          <strong>{shown(h.observedAt, tz, today)}</strong> · {h.containers} cont. · {volumeText(h.volumeMl, system)} · {tempText(h.tempC, system)} · water {lookText(h.waterLook)}, solids {lookText(h.solidsLook)}{" "}
          <span className="muted">({h.collector})</span> <SkewFlag observedAt={h.observedAt} receivedAt={h.receivedAt} />
        </li>
      ))}
    </ul>
  );
}

function Problem({ field, errors }: { field: string; errors: FieldErrors }) {
  const list = errors[field];
  if (!list?.length) return null;
  return (
    <span className="collect-field-error" id={`err-${field}`} role="alert">
      {list.join("; ")}
    </span>
  );
}

export function CollectApp({ data }: { data: PhoneData }) {
  const [user, setUser] = useState(data.user);
  const system = user.unitSystem;
  const vu = volumeUnit(system);
  const tu = temperatureUnit(system);
  const sourcesByCode = useMemo(() => new Map(data.sources.map((s) => [s.code, s])), [data.sources]);
  const known = useMemo(() => new Set(data.sources.map((s) => s.code)), [data.sources]);

  const [draft, setDraft] = useState<Draft>(EMPTY);
  const [editingKey, setEditingKey] = useState<string | null>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [saved, setSaved] = useState<string | null>(null);
  const [signInMessage, setSignInMessage] = useState<string | null>(null);
  const [showAllStops, setShowAllStops] = useState(false);
  const draftLoaded = useRef(false);
  const { box: boxRef, entries, sentNow, online, offlineReady, storagePersisted, needSignIn, setNeedSignIn, lastProblem, boxReady, sending, now, flush, refresh, announce } = useOutbox(user.userId, data.builtAt);

  // The form as last typed survives a reload (the outbox itself lives in IndexedDB).
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
  const source: PhoneSource | undefined = sourcesByCode.get(draft.sourceCode.trim().toUpperCase());
  const materials = source?.materials.length ? source.materials : ["USED_COOKING_OIL"];
  const material = materials.includes(draft.material) ? draft.material : (materials[0] ?? "USED_COOKING_OIL");
  const gaugeVolume = volumeFromGauge(num(draft.containers), num(draft.gaugeSize), num(draft.gaugeFill));

  function chooseSource(code: string) {
    setDraft((d) => ({ ...d, sourceCode: code, material: "" }));
    setShowAllStops(false);
    setErrors((e) => ({ ...e, sourceCode: [] }));
    setSaved(null);
  }

  async function save(ev: FormEvent) {
    ev.preventDefault();
    const box = boxRef.current;
    if (!box) return;
    const editing = editingKey ? entries.find((e) => e.key === editingKey) : undefined;
    const key = editing?.key ?? crypto.randomUUID();
    const observedAt = editing?.pickup.observedAt ?? new Date().toISOString();
    const code = editing?.pickup.code ?? pickupNumber(localParts(new Date(observedAt), data.timeZone).day, key);
    const containers = num(draft.containers);
    const tags = draft.tags
      .split(/[\s,;]+/)
      .map((t) => t.trim())
      .filter(Boolean);
    const notes = [draft.measure === "gauge" && Number.isFinite(gaugeVolume) ? `gauge: ${draft.containers} × ${draft.gaugeSize} ${vu} at ${draft.gaugeFill} %` : "", draft.notes.trim()].filter(Boolean).join("; ");
    const input = {
      code,
      sourceCode: draft.sourceCode.trim().toUpperCase(),
      material,
      observedAt,
      containers,
      containerTags: tags,
      volumeL: litresFrom(draft.measure === "gauge" ? gaugeVolume : num(draft.volume), system),
      tempC: celsiusFrom(num(draft.temp), system),
      waterLook: draft.waterLook,
      solidsLook: draft.solidsLook,
      notes,
      idempotencyKey: key,
    };
    const checked = checkOnPhone(input, known);
    if (!checked.ok) {
      const byField: FieldErrors = {};
      for (const i of checked.issues) {
        const f = (i.field ?? "form").split(".")[0] ?? "form";
        const target = f === "volumeL" && draft.measure === "gauge" ? "gauge" : f;
        (byField[target] ??= []).push(i.message);
      }
      setErrors(byField);
      setSaved(null);
      const first = Object.keys(byField)[0];
      document.getElementById(`field-${first}`)?.focus();
      return;
    }
    const pickup = { ...input, sourceCode: checked.value.sourceCode, material: checked.value.material };
    const entry = editing ? { ...editing, pickup, state: "WAITING" as const, refusal: null, lastProblem: null } : newEntry(pickup, { userId: user.userId, login: user.login, fullName: user.fullName }, new Date());
    try {
      if (editing) await box.replace(entry);
      else await box.add(entry);
    } catch (e) {
      setErrors({ form: [`Could not keep the entry on this phone: ${e instanceof Error ? e.message : String(e)}. Nothing was cleared.`] });
      return;
    }
    setErrors({});
    setEditingKey(null);
    announce();
    setSaved(`Pickup ${code} kept on this phone — it is sent as soon as there is a connection.`);
    setDraft((d) => ({ ...EMPTY, sourceCode: "", measure: d.measure, gaugeSize: d.gaugeSize }));
    await refresh();
    void flush();
  }

  function edit(e: OutboxEntry) {
    const p = e.pickup;
    const vol = system === "us" ? convertVolume(p.volumeL, "L", "gal") : p.volumeL;
    const t = system === "us" ? celsiusToFahrenheit(p.tempC) : p.tempC;
    setDraft({
      ...EMPTY,
      sourceCode: p.sourceCode,
      material: p.material,
      containers: String(p.containers),
      volume: String(Math.round(vol * 1000) / 1000),
      temp: String(Math.round(t * 10) / 10),
      waterLook: (p.waterLook ?? "NONE") as Draft["waterLook"],
      solidsLook: (p.solidsLook ?? "NONE") as Draft["solidsLook"],
      tags: (p.containerTags ?? []).join(" "),
      notes: p.notes ?? "",
    });
    const byField: FieldErrors = {};
    for (const i of e.refusal ?? []) (byField[(i.field ?? "form").split(".")[0] ?? "form"] ??= []).push(i.message);
    setErrors(byField);
    setEditingKey(e.key);
    document.getElementById("field-sourceCode")?.focus();
  }

  async function discard(e: OutboxEntry) {
    if (!window.confirm(`Discard pickup ${e.pickup.code} from ${e.pickup.sourceCode}? It was never stored on the server and cannot be recovered.`)) return;
    await boxRef.current?.discard(e.key);
    await refresh();
    announce();
  }

  async function signInAgain(ev: FormEvent<HTMLFormElement>) {
    ev.preventDefault();
    const form = new FormData(ev.currentTarget);
    setSignInMessage(null);
    try {
      const res = await fetch("/api/session", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ login: form.get("login"), password: form.get("password") }) });
      const body = (await res.json()) as { ok: boolean; value?: { user: { userId: number; login: string; fullName: string; role: string; unitSystem: UnitSystem } }; issues?: Array<{ message: string }> };
      if (!body.ok || !body.value) return setSignInMessage(body.issues?.[0]?.message ?? "Sign-in failed");
      const u = body.value.user;
      setUser({ userId: u.userId, login: u.login, fullName: u.fullName, unitSystem: u.unitSystem, mayRecord: u.role === "COLLECTOR" || u.role === "PRODUCTION" });
      setNeedSignIn(null);
      await flush(u.userId);
    } catch {
      setSignInMessage("No connection: signing in needs the network. Your entries stay on this phone.");
    }
  }

  const summary = summarize(entries, user.userId, now);
  const today = localParts(now, data.timeZone).day;
  const pickedCode = draft.sourceCode.trim().toUpperCase();
  const pickedOnRoute = data.route.some((r) => r.code === pickedCode);
  const routeCodes = new Set(data.route.map((r) => r.code));
  const invalid = (f: string) => (errors[f]?.length ? { "aria-invalid": true as const, "aria-describedby": `err-${f}` } : {});
  const heldLogins = [...new Set(entries.filter((e) => e.enteredBy.userId !== user.userId).map((e) => e.enteredBy.login))];

  return (
    <div className="collect-app" data-outbox-ready={boxReady ? "1" : "0"} data-offline-ready={offlineReady ? "1" : "0"}>
      <div className="collect-bar" role="status" aria-live="polite">
        <span className={online ? "collect-net on" : "collect-net off"}>{online ? "Online" : "No connection"}</span>
        <span className="collect-count" data-waiting={entries.length}>
          {entries.length === 0 ? "All sent" : `${entries.length} waiting`}
        </span>
        <button type="button" className="collect-send" onClick={() => void flush()} disabled={sending || entries.length === 0}>
          {sending ? "Sending…" : "Send now"}
        </button>
      </div>
      <p className="collect-small muted">
        {offlineReady ? "This page also opens without a connection." : "Preparing the offline copy of this page…"}
        {storagePersisted === false ? " The browser may clear stored data when space runs low; send entries when you can." : ""}
      </p>
      {today !== data.today ? (
        <p className="form-error" data-stale-route>
          The route and history below are from {data.today}, when this page was last loaded with a connection. Reload with a connection for today&apos;s route.
        </p>
      ) : null}

      {needSignIn ? (
        <section className="collect-signin" aria-labelledby="signin-h">
          <h2 id="signin-h">Sign in again to send</h2>
          <p>
            {needSignIn}. {summary.waiting} pickup{summary.waiting === 1 ? "" : "s"} stay on this phone until then; nothing is lost.
          </p>
          <form onSubmit={(e) => void signInAgain(e)}>
            <label>
              User name
              <input name="login" autoComplete="username" defaultValue={user.login} required />
            </label>
            <label>
              Password
              <input name="password" type="password" autoComplete="current-password" required />
            </label>
            {signInMessage ? (
              <p className="form-error" role="alert">
                {signInMessage}
              </p>
            ) : null}
            <button type="submit" className="collect-primary">
              Sign in and send
            </button>
          </form>
        </section>
      ) : null}

      {!user.mayRecord ? <p className="form-error">Only collectors and production staff record pickups; this account can look but not save.</p> : null}

      <h1 className="collect-title">Collect</h1>

      <section aria-labelledby="route-h">
        <h2 id="route-h">Today&apos;s route ({data.route.length})</h2>
        {data.route.length === 0 ? (
          <p className="muted">No source is due today.</p>
        ) : (
          <ul className="collect-route">
            {data.route.filter((stop) => showAllStops || !pickedOnRoute || stop.code === pickedCode).map((stop) => {
              const s = sourcesByCode.get(stop.code);
              const picked = draft.sourceCode.trim().toUpperCase() === stop.code;
              return (
                <li key={stop.code}>
                  <button type="button" className={picked ? "collect-stop picked" : "collect-stop"} aria-pressed={picked} onClick={() => chooseSource(stop.code)}>
                    <span className="collect-stop-name">{s?.name ?? stop.code}</span>
                    <span className="collect-stop-meta">
                      {stop.code} · {stop.dueDay === null ? "never collected" : stop.daysOverdue === 0 ? "due today" : `${stop.daysOverdue} day${stop.daysOverdue === 1 ? "" : "s"} overdue`}
                      {s?.collectorNote ? " · note" : ""}
                    </span>
                  </button>
                </li>
              );
            })}
          </ul>
        )}
        {pickedOnRoute && !showAllStops && data.route.length > 1 ? (
          <button type="button" className="collect-secondary collect-wide" onClick={() => setShowAllStops(true)}>
            Show all {data.route.length} stops
          </button>
        ) : null}
      </section>

      <form className="collect-form" onSubmit={(e) => void save(e)} noValidate aria-labelledby="form-h">
        <h2 id="form-h">{editingKey ? "Fix the refused pickup" : "New pickup"}</h2>
        <label className="collect-field">
          Source
          <input
            id="field-sourceCode"
            list="collect-sources"
            value={draft.sourceCode}
            onChange={(e) => chooseSource(e.target.value)}
            placeholder="Tap a stop above or type the source code"
            autoCapitalize="characters"
            autoComplete="off"
            {...invalid("sourceCode")}
          />
          <datalist id="collect-sources">
            {data.sources.map((s) => (
              <option key={s.code} value={s.code}>
                {s.name}
                {routeCodes.has(s.code) ? " (on today's route)" : ""}
              </option>
            ))}
          </datalist>
          <Problem field="sourceCode" errors={errors} />
        </label>

        {source ? (
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
              <History rows={source.history} system={system} tz={data.timeZone} today={today} />
            </details>
          </div>
        ) : null}

        {materials.length > 1 ? (
          <label className="collect-field">
            Material
            <select id="field-material" value={material} onChange={(e) => set("material", e.target.value)} {...invalid("material")}>
              {materials.map((m) => (
                <option key={m} value={m}>
                  {labelOf(m)}
                </option>
              ))}
            </select>
            <Problem field="material" errors={errors} />
          </label>
        ) : null}

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

        <div className="collect-field">
          <label htmlFor="field-containers">Containers</label>
          <div className="collect-stepper">
            <button type="button" aria-label="One container fewer" onClick={() => set("containers", String(Math.max(1, (num(draft.containers) || 1) - 1)))}>
              −
            </button>
            <input id="field-containers" inputMode="numeric" value={draft.containers} onChange={(e) => set("containers", e.target.value)} max={MAX_CONTAINERS} {...invalid("containers")} />
            <button type="button" aria-label="One container more" onClick={() => set("containers", String((num(draft.containers) || 0) + 1))}>
              +
            </button>
          </div>
          <Problem field="containers" errors={errors} />
        </div>

        <fieldset className="collect-choice">
          <legend>Measure by</legend>
          <label>
            <input type="radio" name="measure" checked={draft.measure === "volume"} onChange={() => set("measure", "volume")} /> Volume
          </label>
          <label>
            <input type="radio" name="measure" checked={draft.measure === "gauge"} onChange={() => set("measure", "gauge")} /> Gauge reading
          </label>
        </fieldset>

        {draft.measure === "volume" ? (
          <label className="collect-field">
            Volume ({vu}, all containers)
            <input id="field-volumeL" inputMode="decimal" value={draft.volume} onChange={(e) => set("volume", e.target.value)} {...invalid("volumeL")} />
            <Problem field="volumeL" errors={errors} />
          </label>
        ) : (
          <div className="collect-field" id="field-gauge" tabIndex={-1}>
            <label>
              Container size ({vu})
              <input inputMode="decimal" value={draft.gaugeSize} onChange={(e) => set("gaugeSize", e.target.value)} {...invalid("gauge")} />
            </label>
            <label>
              Fill level on the gauge (%)
              <input inputMode="decimal" value={draft.gaugeFill} onChange={(e) => set("gaugeFill", e.target.value)} {...invalid("gauge")} />
            </label>
            <span className="muted">= {Number.isFinite(gaugeVolume) ? `${formatFixed(gaugeVolume, 1)} ${vu}` : "—"}</span>
            <Problem field="gauge" errors={errors} />
          </div>
        )}

        <label className="collect-field">
          Oil temperature ({tu})
          <input id="field-tempC" inputMode="decimal" value={draft.temp} onChange={(e) => set("temp", e.target.value)} {...invalid("tempC")} />
          <Problem field="tempC" errors={errors} />
        </label>

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

        <label className="collect-field">
          Container labels (optional, one per container)
          <input id="field-containerTags" value={draft.tags} onChange={(e) => set("tags", e.target.value)} autoCapitalize="characters" placeholder="e.g. C-0012 C-0013" {...invalid("containerTags")} />
          <Problem field="containerTags" errors={errors} />
        </label>

        <label className="collect-field">
          Notes
          <textarea id="field-notes" value={draft.notes} onChange={(e) => set("notes", e.target.value)} rows={2} maxLength={500} {...invalid("notes")} />
          <Problem field="notes" errors={errors} />
        </label>

        <Problem field="form" errors={errors} />
        <Problem field="observedAt" errors={errors} />
        <Problem field="code" errors={errors} />
        <button type="submit" className="collect-primary" disabled={!boxReady || !user.mayRecord}>
          {editingKey ? "Save the corrected pickup" : "Save pickup"}
        </button>
        {editingKey ? (
          <button
            type="button"
            className="collect-secondary"
            onClick={() => {
              setEditingKey(null);
              setErrors({});
              setDraft(EMPTY);
            }}
          >
            Stop editing
          </button>
        ) : null}
        {saved ? (
          <p className="collect-saved" role="status">
            {saved}
          </p>
        ) : null}
      </form>

      <section aria-labelledby="waiting-h" className="collect-waiting">
        <h2 id="waiting-h">Waiting to send ({entries.length})</h2>
        {lastProblem && entries.length ? <p className="muted">{lastProblem}. Tries again when the connection returns and every {SEND_EVERY_MS / 1000} s.</p> : null}
        {summary.stale ? <p className="form-error">{summary.stale} entr{summary.stale === 1 ? "y has" : "ies have"} waited more than {STALE_AFTER_MS / 3_600_000} h. They are kept; find a connection and press Send now.</p> : null}
        {heldLogins.length ? <p className="form-error">Entries made by {heldLogins.join(", ")} wait until that person signs in on this phone.</p> : null}
        {entries.length === 0 ? (
          <p className="muted">Nothing waiting: everything saved on this phone is on the server.</p>
        ) : (
          <ul className="collect-list">
            {[...entries]
              .sort((a, b) => a.savedAt.localeCompare(b.savedAt))
              .map((e) => (
                <li key={e.key} data-state={e.state}>
                  <strong>{sourcesByCode.get(e.pickup.sourceCode)?.name ?? e.pickup.sourceCode}</strong> · {e.pickup.containers} cont. · {volumeText(Math.round(e.pickup.volumeL * 1000), system)}
                  <br />
                  <span className="muted">
                    {e.pickup.code} · observed {shown(e.pickup.observedAt, data.timeZone, today)}
                    {e.attempts ? ` · ${e.attempts} tr${e.attempts === 1 ? "y" : "ies"}` : ""}
                  </span>
                  {e.state === "REFUSED" ? (
                    <>
                      <span className="collect-field-error" role="alert">
                        Refused by the server: {(e.refusal ?? []).map((i) => `${i.field ? `${i.field}: ` : ""}${i.message}`).join("; ")}
                      </span>
                      <span className="collect-row-actions">
                        <button type="button" onClick={() => edit(e)}>
                          Fix
                        </button>
                        <button type="button" onClick={() => void discard(e)}>
                          Discard…
                        </button>
                      </span>
                    </>
                  ) : e.lastProblem ? (
                    <span className="muted"> · {e.lastProblem}</span>
                  ) : null}
                </li>
              ))}
          </ul>
        )}
      </section>

      <p className="collect-links">
        <a href="/labels/scan">Scan a label</a> · <a href="/labels">Print labels</a>
      </p>

      <section aria-labelledby="sent-h" className="collect-sent">
        <h2 id="sent-h">Sent recently</h2>
        {sentNow.length === 0 && data.received.length === 0 ? (
          <p className="muted">Nothing sent in the last two days.</p>
        ) : (
          <ul className="collect-list">
            {sentNow.map((s) => (
              <li key={s.code} data-record-id={s.recordId}>
                <strong>{sourcesByCode.get(s.sourceCode)?.name ?? s.sourceCode}</strong> · {s.code} stored as record {s.recordId}
                <br />
                <span className="muted">observed {shown(s.observedAt, data.timeZone, today)}</span> {s.receivedAt ? <SkewFlag observedAt={s.observedAt} receivedAt={s.receivedAt} /> : null}
              </li>
            ))}
            {data.received
              .filter((r) => !sentNow.some((s) => s.code === r.code))
              .map((r) => (
                <li key={r.code}>
                  <strong>{sourcesByCode.get(r.sourceCode)?.name ?? r.sourceCode}</strong> · {r.code} · {volumeText(r.volumeMl, system)}
                  <br />
                  <span className="muted">
                    observed {shown(r.observedAt, data.timeZone, today)}, received {shown(r.receivedAt, data.timeZone, today)}
                  </span>{" "}
                  <SkewFlag observedAt={r.observedAt} receivedAt={r.receivedAt} />
                </li>
              ))}
          </ul>
        )}
      </section>
    </div>
  );
}
