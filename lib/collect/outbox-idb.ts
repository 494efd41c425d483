// The outbox kept in the browser's IndexedDB (via `idb`), and the send loop over it.
// No clock or network of its own: `now` and `send` are passed in, so tests run it on fake-indexeddb.
import { openDB } from "idb";
import type { DBSchema, IDBPDatabase } from "idb";
import type { OutboxEntry, Outcome, Reply } from "@/lib/collect/outbox";
import { applyOutcome, classifyReply, sendable } from "@/lib/collect/outbox";

interface OutboxDb extends DBSchema {
  entries: { key: string; value: OutboxEntry };
}

export const OUTBOX_DB_NAME = "tracevat-collect";
const VERSION = 1;

export interface Outbox {
  add(entry: OutboxEntry): Promise<void>;
  replace(entry: OutboxEntry): Promise<void>;
  all(): Promise<OutboxEntry[]>;
  discard(key: string): Promise<void>;
  /** Applies one attempt's outcome in a single IndexedDB transaction; true when the entry left the outbox. */
  settle(key: string, outcome: Outcome, now: Date): Promise<boolean>;
  close(): void;
}

export async function openOutbox(name = OUTBOX_DB_NAME): Promise<Outbox> {
  const db: IDBPDatabase<OutboxDb> = await openDB<OutboxDb>(name, VERSION, {
    upgrade(d) {
      if (!d.objectStoreNames.contains("entries")) d.createObjectStore("entries", { keyPath: "key" });
    },
  });
  return {
    async add(entry) {
      // add (not put): a second save under the same key is refused instead of overwriting.
      await db.add("entries", entry);
    },
    async replace(entry) {
      await db.put("entries", entry);
    },
    all: () => db.getAll("entries"),
    async discard(key) {
      await db.delete("entries", key);
    },
    async settle(key, outcome, now) {
      const tx = db.transaction("entries", "readwrite");
      const current = await tx.store.get(key);
      if (!current) {
        await tx.done;
        return outcome.kind === "STORED";
      }
      const next = applyOutcome(current, outcome, now);
      if (next === null) await tx.store.delete(key);
      else await tx.store.put(next);
      await tx.done;
      return next === null;
    },
    close: () => db.close(),
  };
}

export interface FlushReport {
  sent: number;
  stored: Array<{
    key: string;
    recordId: number;
    code: string;
    receivedAt: string | null;
    observedAt: string;
    sourceCode: string;
  }>;
  kept: number;
  /** Set when the server asked for a new sign-in; the loop stops and nothing is lost. */
  signIn: string | null;
  /** Set when the network failed; the loop stops until the next trigger. */
  offline: string | null;
}

/**
 * Sends the signed-in user's waiting entries one at a time, oldest first. Stops at the first lost
 * answer (the network is gone) or sign-in request; refused entries are marked and the loop goes on.
 */
export async function flushOutbox(
  outbox: Outbox,
  userId: number,
  send: (e: OutboxEntry) => Promise<Reply>,
  now: () => Date,
): Promise<FlushReport> {
  const report: FlushReport = { sent: 0, stored: [], kept: 0, signIn: null, offline: null };
  for (const entry of sendable(await outbox.all(), userId)) {
    let reply: Reply;
    try {
      reply = await send(entry);
    } catch (e) {
      reply = { lost: e instanceof Error ? e.message : String(e) };
    }
    report.sent++;
    const outcome = classifyReply(entry, reply);
    const left = await outbox.settle(entry.key, outcome, now());
    if (left && outcome.kind === "STORED")
      report.stored.push({
        key: entry.key,
        recordId: outcome.recordId,
        code: outcome.code,
        receivedAt: outcome.receivedAt,
        observedAt: entry.pickup.observedAt,
        sourceCode: entry.pickup.sourceCode,
      });
    else report.kept++;
    if (outcome.kind === "SIGN_IN") {
      report.signIn = outcome.problem;
      break;
    }
    if (outcome.kind === "RETRY" && "lost" in reply) {
      report.offline = outcome.problem;
      break;
    }
  }
  return report;
}
