// One unit of work: a transaction that either commits entirely or returns its reasons as a value, run
// under the client's idempotency key when one is in force (a retry gets the first answer back).
import { AsyncLocalStorage } from "node:async_hooks";
import type { Db, Tx } from "@/lib/core/connect";
import { dialectOf } from "@/lib/core/bulk-insert";
import type { DomainIssue, Result } from "@/lib/core/result";
import { fail, failMany, ok } from "@/lib/core/result";
import { classifyDatabaseFault, FAULT_MESSAGES } from "@/lib/core/faults";
import { log } from "@/lib/log/log.service";

/** Aborts the surrounding transaction with expected outcomes; turned back into a value by runInTransaction. */
export class Rejection extends Error {
  constructor(readonly issues: DomainIssue[]) {
    super(issues.map((i) => i.message).join("; "));
    this.name = "Rejection";
  }
}

export function reject(code: DomainIssue["code"], message: string, field?: string): never {
  throw new Rejection([field === undefined ? { code, message } : { code, message, field }]);
}

export interface IdempotencyContext {
  userId: number;
  key: string;
  /** SHA-256 of the request body: the same key with a different body is refused. */
  requestHash: string;
}

const idempotency = new AsyncLocalStorage<IdempotencyContext>();

/**
 * Runs a client's write under its idempotency key: the first transaction inside fn stores the key and
 * its answer atomically with the change; a retry with the same key gets that answer back unchanged.
 */
export function withIdempotencyKey<T>(ctx: IdempotencyContext, fn: () => Promise<T>): Promise<T> {
  return idempotency.run(ctx, fn);
}

/**
 * Runs fn with no idempotency key in force: for the rows of a grid batch, whose one key is stored once
 * by the batch's own transaction while each row's service joins that transaction.
 */
export function withoutIdempotencyKey<T>(fn: () => Promise<T>): Promise<T> {
  return idempotency.exit(fn);
}

/** The idempotency key the current write runs under, for log lines; undefined without one. */
export function idempotencyKeyInForce(): string | undefined {
  return idempotency.getStore()?.key;
}

class Replay extends Error {
  constructor(readonly answer: unknown) {
    super("replay");
  }
}

/** All-or-nothing: either fn commits entirely, or nothing is written and the reasons come back as a value. */
export async function runInTransaction<T>(db: Db, fn: (tx: Tx) => Promise<T>, timeoutMs = 30_000): Promise<Result<T>> {
  const key = idempotency.getStore();
  try {
    return ok(
      await db.$transaction(
        async (tx) => {
          if (!key) return fn(tx);
          // Twins with one key queue behind each other, so the second reads the first's stored answer
          // instead of racing it to the same unique rows. SQLite already runs one writer at a time.
          if (dialectOf(tx) === "postgresql")
            await tx.$executeRaw`SELECT pg_advisory_xact_lock(hashtext(${`${key.userId}:${key.key}`}))`;
          const earlier = await tx.idempotencyRecord.findUnique({
            where: { userId_key: { userId: key.userId, key: key.key } },
          });
          if (earlier) {
            if (earlier.requestHash !== key.requestHash)
              reject(
                "IDEMPOTENCY.KEY_REUSED",
                "This idempotency key was already used for a different request",
                "Idempotency-Key",
              );
            throw new Replay(JSON.parse(earlier.response));
          }
          const value = await fn(tx);
          await tx.idempotencyRecord.create({
            data: {
              userId: key.userId,
              key: key.key,
              requestHash: key.requestHash,
              response: JSON.stringify(value ?? null),
              createdAt: new Date(),
            },
          });
          return value;
        },
        { timeout: timeoutMs, maxWait: timeoutMs },
      ),
    );
  } catch (e) {
    if (e instanceof Replay) return ok(e.answer as T);
    if (e instanceof Rejection) return failMany(e.issues);
    if (key && isUniqueViolation(e)) {
      // A concurrent twin committed first: answer with what it stored.
      const earlier = await db.idempotencyRecord.findUnique({
        where: { userId_key: { userId: key.userId, key: key.key } },
      });
      if (earlier && earlier.requestHash === key.requestHash) return ok(JSON.parse(earlier.response) as T);
    }
    // A lock held past the busy timeout, or a lost connection: the transaction never committed.
    const fault = classifyDatabaseFault(e);
    if (fault) {
      log.warn(
        { event: "database.fault", code: fault, err: e },
        "a write was refused by a database fault; nothing was saved",
      );
      return fail(fault, FAULT_MESSAGES[fault]);
    }
    throw e;
  }
}

function isUniqueViolation(e: unknown): boolean {
  return typeof e === "object" && e !== null && "code" in e && (e as { code?: unknown }).code === "P2002";
}
