// The two times of a pickup: observedAt from the phone, receivedAt from the server clock.

/**
 * A gap above this is flagged for review: either the entry waited long in the phone's outbox, or the
 * phone's clock is wrong. One hour is common practice for "recorded at the time" in paper-to-digital
 * field logging; it is our default, not a regulation.
 */
export const TIME_SKEW_FLAG_MS = 60 * 60_000;

export type TimeSkew =
  | { flag: false; gapMs: number }
  | { flag: true; gapMs: number; kind: "RECEIVED_LATE" | "PHONE_AHEAD"; message: string };

function span(ms: number): string {
  const minutes = Math.round(Math.abs(ms) / 60_000);
  const d = Math.floor(minutes / 1440);
  const h = Math.floor((minutes % 1440) / 60);
  const m = minutes % 60;
  return [d ? `${d} d` : "", h ? `${h} h` : "", !d && m ? `${m} min` : ""].filter(Boolean).join(" ") || "0 min";
}

/** gapMs = receivedAt − observedAt; negative means the phone said "later" than the server's clock. */
export function timeSkew(observedAt: Date, receivedAt: Date, thresholdMs = TIME_SKEW_FLAG_MS): TimeSkew {
  const gapMs = receivedAt.getTime() - observedAt.getTime();
  if (Math.abs(gapMs) <= thresholdMs) return { flag: false, gapMs };
  return gapMs > 0
    ? { flag: true, gapMs, kind: "RECEIVED_LATE", message: `Received ${span(gapMs)} after it was observed` }
    : { flag: true, gapMs, kind: "PHONE_AHEAD", message: `Phone time is ${span(gapMs)} ahead of the server's` };
}

/**
 * Typed or imported pickups (the grid) have no phone outbox to explain a gap: a pickup observed more
 * than the flag threshold after the server's clock cannot have happened yet, so it is refused there.
 * Returns the message, or null when the time is acceptable or not a time at all (the schema says so).
 */
export function futureObservation(observedAt: unknown, now: Date, thresholdMs = TIME_SKEW_FLAG_MS): string | null {
  const t =
    observedAt instanceof Date
      ? observedAt
      : typeof observedAt === "string" || typeof observedAt === "number"
        ? new Date(observedAt)
        : null;
  if (t === null || Number.isNaN(t.getTime())) return null;
  const ahead = t.getTime() - now.getTime();
  return ahead > thresholdMs
    ? `Observed time is ${span(ahead)} later than now; a pickup cannot be recorded before it happens`
    : null;
}
