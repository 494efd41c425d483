// The phone's outbox: pickups saved on the device wait here until the server confirms them.
// Pure state logic (no IndexedDB, no clock, no randomness): the caller passes `now` and the keys.
import type { PickupInput } from "@/lib/feedstock/pickup.schema";

/** An entry older than this is shown as overdue to send (the entry itself never expires). */
export const STALE_AFTER_MS = 24 * 3_600_000;
/** The page retries on this timer as well as on start and when the network returns. */
export const SEND_EVERY_MS = 30_000;

export interface EnteredBy {
  userId: number;
  login: string;
  fullName: string;
}

export interface Refusal {
  code: string;
  message: string;
  field?: string;
}

export type EntryState =
  /** Not yet confirmed; sent on the next attempt. */
  | "WAITING"
  /** The server refused the input (stored nothing); the collector fixes or discards it. */
  | "REFUSED";

export interface OutboxEntry {
  /** Client-made idempotency key (UUID), also the entry's key in IndexedDB. */
  key: string;
  /** The body sent to POST /api/pickups; observedAt is the phone's time, ISO 8601. */
  pickup: PickupInput & { code: string; sourceCode: string; observedAt: string; idempotencyKey: string };
  enteredBy: EnteredBy;
  savedAt: string;
  state: EntryState;
  attempts: number;
  lastAttemptAt: string | null;
  /** Why the last attempt did not confirm (network, sign-in, server refusal). */
  lastProblem: string | null;
  refusal: Refusal[] | null;
}

export function newEntry(pickup: OutboxEntry["pickup"], enteredBy: EnteredBy, now: Date): OutboxEntry {
  return {
    key: pickup.idempotencyKey,
    pickup,
    enteredBy,
    savedAt: now.toISOString(),
    state: "WAITING",
    attempts: 0,
    lastAttemptAt: null,
    lastProblem: null,
    refusal: null,
  };
}

/** What came back from one attempt: an HTTP answer, or no answer at all. */
export type Reply = { status: number; body: unknown } | { lost: string };

export type Outcome =
  | { kind: "STORED"; recordId: number; code: string; receivedAt: string | null }
  | { kind: "RETRY"; problem: string }
  | { kind: "SIGN_IN"; problem: string }
  | { kind: "REFUSED"; issues: Refusal[] };

function issuesOf(body: unknown): Refusal[] {
  if (typeof body !== "object" || body === null || !("issues" in body) || !Array.isArray(body.issues)) return [];
  return body.issues.filter(
    (i): i is Refusal =>
      typeof i === "object" &&
      i !== null &&
      typeof (i as Refusal).code === "string" &&
      typeof (i as Refusal).message === "string",
  );
}

/**
 * Reads the server's answer for one entry. Only a 2xx that carries the stored record's id and our
 * pickup number counts as confirmed; anything else keeps the entry.
 */
export function classifyReply(entry: OutboxEntry, reply: Reply): Outcome {
  if ("lost" in reply) return { kind: "RETRY", problem: `No answer from the server (${reply.lost})` };
  const { status, body } = reply;
  if (status >= 200 && status < 300) {
    const value = typeof body === "object" && body !== null && "value" in body ? body.value : null;
    const v = value as { id?: unknown; code?: unknown; receivedAt?: unknown } | null;
    if (
      v &&
      typeof v.id === "number" &&
      Number.isInteger(v.id) &&
      v.id > 0 &&
      v.code === entry.pickup.code.trim().toUpperCase()
    ) {
      return {
        kind: "STORED",
        recordId: v.id,
        code: v.code,
        receivedAt: typeof v.receivedAt === "string" ? v.receivedAt : null,
      };
    }
    return { kind: "RETRY", problem: "The server answered without the stored record's number" };
  }
  const issues = issuesOf(body);
  if (status === 401) return { kind: "SIGN_IN", problem: "Your session has ended: sign in again to send" };
  if (status === 403)
    return {
      kind: "SIGN_IN",
      problem: issues[0]?.message ?? "This account may not record pickups: sign in as the collector",
    };
  if (status === 409 && issues[0]?.code === "IDEMPOTENCY.IN_PROGRESS")
    return { kind: "RETRY", problem: "The server is still storing the first attempt" };
  if (status === 429 || status >= 500 || issues.length === 0)
    return { kind: "RETRY", problem: `The server answered ${status}; will try again` };
  return { kind: "REFUSED", issues };
}

/** The entry after an attempt, or null when it leaves the outbox (confirmed with a record id). */
export function applyOutcome(entry: OutboxEntry, outcome: Outcome, now: Date): OutboxEntry | null {
  const tried = { ...entry, attempts: entry.attempts + 1, lastAttemptAt: now.toISOString() };
  switch (outcome.kind) {
    case "STORED":
      return null;
    case "RETRY":
    case "SIGN_IN":
      return { ...tried, lastProblem: outcome.problem };
    case "REFUSED":
      return {
        ...tried,
        state: "REFUSED",
        refusal: outcome.issues,
        lastProblem: outcome.issues.map((i) => i.message).join("; "),
      };
  }
}

/** Entries to send now for the signed-in user, oldest first; refused ones wait for the collector. */
export function sendable(entries: readonly OutboxEntry[], userId: number): OutboxEntry[] {
  return entries
    .filter((e) => e.state === "WAITING" && e.enteredBy.userId === userId)
    .sort((a, b) => a.savedAt.localeCompare(b.savedAt) || a.key.localeCompare(b.key));
}

export interface OutboxSummary {
  total: number;
  waiting: number;
  refused: number;
  /** Entered by someone other than the signed-in user: held until they sign in. */
  heldForOthers: number;
  /** Older than STALE_AFTER_MS and still not confirmed. */
  stale: number;
  oldestSavedAt: string | null;
}

export function summarize(entries: readonly OutboxEntry[], userId: number | null, now: Date): OutboxSummary {
  let waiting = 0;
  let refused = 0;
  let heldForOthers = 0;
  let stale = 0;
  let oldest: string | null = null;
  for (const e of entries) {
    if (e.state === "REFUSED") refused++;
    else if (userId !== null && e.enteredBy.userId !== userId) heldForOthers++;
    else waiting++;
    if (now.getTime() - new Date(e.savedAt).getTime() > STALE_AFTER_MS) stale++;
    if (oldest === null || e.savedAt < oldest) oldest = e.savedAt;
  }
  return { total: entries.length, waiting, refused, heldForOthers, stale, oldestSavedAt: oldest };
}

/** Text for the sign-out warning, or null when nothing is waiting. */
export function signOutWarning(entries: readonly OutboxEntry[]): string | null {
  if (entries.length === 0) return null;
  const n = entries.length;
  return `${n} pickup${n === 1 ? " is" : "s are"} still waiting on this phone and not yet on the server. They stay on this phone after you sign out and are sent when you sign in again here. Sign out anyway?`;
}
