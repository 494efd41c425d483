import { describe, expect, it } from "vitest";
import { classifyDatabaseFault } from "@/lib/core/faults";
import { statusFor } from "@/lib/http";

// Codes from SQLite's result-code list (sqlite.org/rescode.html) and PostgreSQL's Appendix A
// (SQLSTATE 57P01 admin_shutdown, class 08 connection exception); socket codes from Node's net module.
const withCause = (message: string, cause: unknown) => Object.assign(new Error(message), { cause });

describe("driver errors to retryable database faults", () => {
  it.each<[string, unknown]>([
    ["better-sqlite3 SQLITE_BUSY", Object.assign(new Error("database is locked"), { code: "SQLITE_BUSY" })],
    ["an extended busy code", Object.assign(new Error("x"), { code: "SQLITE_BUSY_SNAPSHOT" })],
    [
      "Prisma wrapping the adapter's SQLITE_BUSY",
      Object.assign(new Error("Operations timed out"), {
        code: "P1008",
        meta: {
          driverAdapterError: {
            cause: { kind: "SocketTimeout", originalCode: "SQLITE_BUSY", originalMessage: "database is locked" },
          },
        },
      }),
    ],
    ["only the message", "SqliteError: database is locked"],
  ])("%s is DATABASE.BUSY", (_, error) => {
    expect(classifyDatabaseFault(error)).toBe("DATABASE.BUSY");
  });

  it.each<[string, unknown]>([
    [
      "pg 57P01 admin_shutdown",
      Object.assign(new Error("terminating connection due to administrator command"), {
        code: "57P01",
        severity: "FATAL",
      }),
    ],
    ["pg connection exception class 08", Object.assign(new Error("x"), { code: "08006" })],
    [
      "a reset socket",
      Object.assign(new Error("read ECONNRESET"), { code: "ECONNRESET", syscall: "read", errno: -104 }),
    ],
    ["node-postgres after the socket closed", new Error("Connection terminated unexpectedly")],
    ["a client no longer usable", new Error("Client has encountered a connection error and is not queryable")],
    ["Prisma P1017", Object.assign(new Error("Server has closed the connection."), { code: "P1017" })],
    [
      "the adapter's ConnectionClosed kind, two causes deep",
      withCause("outer", withCause("inner", { kind: "ConnectionClosed" })),
    ],
  ])("%s is DATABASE.UNAVAILABLE", (_, error) => {
    expect(classifyDatabaseFault(error)).toBe("DATABASE.UNAVAILABLE");
  });

  it.each<[string, unknown]>([
    ["a unique violation", Object.assign(new Error("Unique constraint failed"), { code: "P2002" })],
    ["a programming error", new TypeError("cannot read properties of undefined")],
    [
      "a constraint from SQLite",
      Object.assign(new Error("FOREIGN KEY constraint failed"), { code: "SQLITE_CONSTRAINT_FOREIGNKEY" }),
    ],
    ["null", null],
    ["a number", 42],
  ])("%s is not a database fault", (_, error) => {
    expect(classifyDatabaseFault(error)).toBeNull();
  });

  it("stops at a cycle of causes", () => {
    const a: { message: string; cause?: unknown } = { message: "a" };
    a.cause = a;
    expect(classifyDatabaseFault(a)).toBeNull();
  });

  it("both faults answer 503 Service Unavailable (RFC 9110 §15.6.4)", () => {
    expect(statusFor([{ code: "DATABASE.BUSY", message: "m" }])).toBe(503);
    expect(statusFor([{ code: "DATABASE.UNAVAILABLE", message: "m" }])).toBe(503);
  });
});
