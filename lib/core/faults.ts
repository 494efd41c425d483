// Which driver errors mean "the database could not take this write right now": a lock another
// connection holds past our busy timeout (SQLite), or a lost connection (PostgreSQL). Both abort the
// transaction before commit, so nothing was saved and the same request can simply be sent again.
// Pure: an error in, a stable code (or null for anything else) out.

export type DatabaseFault = "DATABASE.BUSY" | "DATABASE.UNAVAILABLE";

export const FAULT_MESSAGES: Record<DatabaseFault, string> = {
  "DATABASE.BUSY": "The records are busy; nothing was saved. Try again in a moment.",
  "DATABASE.UNAVAILABLE": "The database connection was lost; nothing was saved. Try again.",
};

// SQLite result codes (sqlite.org/rescode.html): SQLITE_BUSY and its extended codes; SQLITE_LOCKED is
// a lock inside one connection's shared cache, which the same retry clears.
const BUSY_CODES = /^SQLITE_(BUSY|LOCKED)/;
const BUSY_TEXT = /database (table )?is locked|SQLITE_BUSY/i;
// PostgreSQL SQLSTATE class 08 (connection exception) and 57P01–57P03 (admin/crash shutdown, cannot
// connect now), per the PostgreSQL manual's Appendix A; socket errors from Node's net module.
const PG_LOST_CODES = /^(08[0-9A-Z]{3}|57P0[123]|ECONNRESET|ECONNREFUSED|EPIPE|ETIMEDOUT|ENOTFOUND)$/;
const PG_LOST_TEXT =
  /connection terminated|terminating connection|server closed the connection|connection (is )?closed|not queryable|ECONNRESET|ECONNREFUSED|EPIPE|57P01|Can't reach database server/i;
// Prisma's own codes for the same situations: P1001 cannot reach, P1017 server closed the connection;
// driver-adapter kinds are carried as `kind` on the error's cause.
const PRISMA_LOST = new Set(["P1001", "P1017"]);
const ADAPTER_LOST = new Set(["ConnectionClosed", "DatabaseNotReachable"]);

interface Fields {
  codes: string[];
  texts: string[];
}

/** Codes and messages from the error and everything it wraps (cause, meta, driverAdapterError), bounded. */
function collect(error: unknown, into: Fields = { codes: [], texts: [] }, depth = 0): Fields {
  if (depth > 6 || error === null || error === undefined) return into;
  if (typeof error === "string") {
    into.texts.push(error);
    return into;
  }
  if (typeof error !== "object") return into;
  const o = error as Record<string, unknown>;
  for (const k of ["code", "originalCode", "kind", "errorCode"]) if (typeof o[k] === "string") into.codes.push(o[k]);
  for (const k of ["message", "originalMessage"]) if (typeof o[k] === "string") into.texts.push(o[k]);
  for (const k of ["cause", "meta", "driverAdapterError"]) if (k in o) collect(o[k], into, depth + 1);
  return into;
}

/** The fault a driver error stands for, or null when it is something else (a bug, a constraint…). */
export function classifyDatabaseFault(error: unknown): DatabaseFault | null {
  const { codes, texts } = collect(error);
  if (codes.some((c) => BUSY_CODES.test(c)) || texts.some((t) => BUSY_TEXT.test(t))) return "DATABASE.BUSY";
  if (codes.some((c) => PG_LOST_CODES.test(c) || PRISMA_LOST.has(c) || ADAPTER_LOST.has(c)))
    return "DATABASE.UNAVAILABLE";
  if (texts.some((t) => PG_LOST_TEXT.test(t))) return "DATABASE.UNAVAILABLE";
  return null;
}
