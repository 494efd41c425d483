"use client";
// What waits on the phone (with the server's refusals to fix or discard) and what was sent recently.
import type { OutboxEntry } from "@/lib/collect/outbox";
import { SEND_EVERY_MS, STALE_AFTER_MS } from "@/lib/collect/outbox";
import type { UnitSystem } from "@/lib/quantity/units";
import type { PhoneData, PhoneSource } from "@/app/collect/types";
import type { SentNow } from "@/app/collect/use-outbox";
import { SkewFlag } from "@/app/collect/collect-bits";
import { shown, volumeText } from "@/app/collect/collect-text";

interface Shown {
  sourcesByCode: ReadonlyMap<string, PhoneSource>;
  system: UnitSystem;
  timeZone: string;
  today: string;
}

function WaitingEntry({
  e,
  view,
  onFix,
  onDiscard,
}: {
  e: OutboxEntry;
  view: Shown;
  onFix: (e: OutboxEntry) => void;
  onDiscard: (e: OutboxEntry) => void;
}) {
  return (
    <li data-state={e.state}>
      <strong>{view.sourcesByCode.get(e.pickup.sourceCode)?.name ?? e.pickup.sourceCode}</strong> ·{" "}
      {e.pickup.containers} cont. · {volumeText(Math.round(e.pickup.volumeL * 1000), view.system)}
      <br />
      <span className="muted">
        {e.pickup.code} · observed {shown(e.pickup.observedAt, view.timeZone, view.today)}
        {e.attempts ? ` · ${e.attempts} tr${e.attempts === 1 ? "y" : "ies"}` : ""}
      </span>
      {e.state === "REFUSED" ? (
        <>
          <span className="collect-field-error" role="alert">
            Refused by the server:{" "}
            {(e.refusal ?? []).map((i) => `${i.field ? `${i.field}: ` : ""}${i.message}`).join("; ")}
          </span>
          <span className="collect-row-actions">
            <button type="button" onClick={() => onFix(e)}>
              Fix
            </button>
            <button type="button" onClick={() => onDiscard(e)}>
              Discard…
            </button>
          </span>
        </>
      ) : e.lastProblem ? (
        <span className="muted"> · {e.lastProblem}</span>
      ) : null}
    </li>
  );
}

interface WaitingListProps {
  entries: OutboxEntry[];
  lastProblem: string | null;
  stale: number;
  heldLogins: string[];
  view: Shown;
  onFix: (e: OutboxEntry) => void;
  onDiscard: (e: OutboxEntry) => void;
}

export function WaitingList({ entries, lastProblem, stale, heldLogins, view, onFix, onDiscard }: WaitingListProps) {
  return (
    <section aria-labelledby="waiting-h" className="collect-waiting">
      <h2 id="waiting-h">Waiting to send ({entries.length})</h2>
      {lastProblem && entries.length ? (
        <p className="muted">
          {lastProblem}. Tries again when the connection returns and every {SEND_EVERY_MS / 1000} s.
        </p>
      ) : null}
      {stale ? (
        <p className="form-error">
          {stale} entr{stale === 1 ? "y has" : "ies have"} waited more than {STALE_AFTER_MS / 3_600_000} h. They are
          kept; find a connection and press Send now.
        </p>
      ) : null}
      {heldLogins.length ? (
        <p className="form-error">
          Entries made by {heldLogins.join(", ")} wait until that person signs in on this phone.
        </p>
      ) : null}
      {entries.length === 0 ? (
        <p className="muted">Nothing waiting: everything saved on this phone is on the server.</p>
      ) : (
        <ul className="collect-list">
          {[...entries]
            .sort((a, b) => a.savedAt.localeCompare(b.savedAt))
            .map((e) => (
              <WaitingEntry key={e.key} e={e} view={view} onFix={onFix} onDiscard={onDiscard} />
            ))}
        </ul>
      )}
    </section>
  );
}

export function SentList({
  sentNow,
  received,
  view,
}: {
  sentNow: SentNow[];
  received: PhoneData["received"];
  view: Shown;
}) {
  const { sourcesByCode, timeZone: tz, today } = view;
  return (
    <section aria-labelledby="sent-h" className="collect-sent">
      <h2 id="sent-h">Sent recently</h2>
      {sentNow.length === 0 && received.length === 0 ? (
        <p className="muted">Nothing sent in the last two days.</p>
      ) : (
        <ul className="collect-list">
          {sentNow.map((s) => (
            <li key={s.code} data-record-id={s.recordId}>
              <strong>{sourcesByCode.get(s.sourceCode)?.name ?? s.sourceCode}</strong> · {s.code} stored as record{" "}
              {s.recordId}
              <br />
              <span className="muted">observed {shown(s.observedAt, tz, today)}</span>{" "}
              {s.receivedAt ? <SkewFlag observedAt={s.observedAt} receivedAt={s.receivedAt} /> : null}
            </li>
          ))}
          {received
            .filter((r) => !sentNow.some((s) => s.code === r.code))
            .map((r) => (
              <li key={r.code}>
                <strong>{sourcesByCode.get(r.sourceCode)?.name ?? r.sourceCode}</strong> · {r.code} ·{" "}
                {volumeText(r.volumeMl, view.system)}
                <br />
                <span className="muted">
                  observed {shown(r.observedAt, tz, today)}, received {shown(r.receivedAt, tz, today)}
                </span>{" "}
                <SkewFlag observedAt={r.observedAt} receivedAt={r.receivedAt} />
              </li>
            ))}
        </ul>
      )}
    </section>
  );
}
