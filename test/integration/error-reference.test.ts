import { afterEach, describe, expect, it, vi } from "vitest";
import { handled } from "@/lib/api/handle.service";
import { respond } from "@/lib/api/json-route.service";
import { fail } from "@/lib/core/result";

// An unexpected failure answers the JSON issue shape with 500 and a short reference, and the same
// reference reaches the structured log with the route and the stack — never the request body.
describe("route handlers fail with a reference", () => {
  afterEach(() => vi.restoreAllMocks());

  it("answers 500 with a reference that is also in the log", async () => {
    const lines: string[] = [];
    vi.spyOn(process.stdout, "write").mockImplementation((chunk: string | Uint8Array) => {
      lines.push(String(chunk));
      return true;
    });
    const route = handled("POST /api/example", async (request: Request) => {
      await request.text();
      throw new Error("database went away");
    });
    const res = await route(
      new Request("http://127.0.0.1/api/example", {
        method: "POST",
        body: JSON.stringify({ password: "never-logged" }),
      }),
    );
    expect(res.status).toBe(500);
    const body = (await res.json()) as {
      ok: boolean;
      issues: Array<{ code: string; message: string; reference: string }>;
    };
    expect(body.ok).toBe(false);
    const issue = body.issues[0]!;
    expect(issue.code).toBe("SERVER.UNEXPECTED");
    expect(issue.reference).toMatch(/^[A-Z2-9]{8}$/);
    expect(issue.message).toContain(`Tell your administrator this reference: ${issue.reference}`);
    const entry = lines
      .map((l) => JSON.parse(l) as Record<string, unknown>)
      .find((l) => l.reference === issue.reference);
    expect(entry).toBeDefined();
    expect(entry!.route).toBe("POST /api/example");
    expect(String((entry!.err as { stack: string }).stack)).toContain("database went away");
    expect(lines.join("")).not.toContain("never-logged");
  });

  it("answers a lost database connection outside a transaction with a retryable 503", async () => {
    vi.spyOn(process.stdout, "write").mockImplementation(() => true);
    // PostgreSQL SQLSTATE 57P01 admin_shutdown (PostgreSQL manual, Appendix A).
    const route = handled("GET /api/example", async () => {
      throw Object.assign(new Error("terminating connection due to administrator command"), { code: "57P01" });
    });
    const res = await route(new Request("http://127.0.0.1/api/example"));
    expect(res.status).toBe(503);
    expect(res.headers.get("retry-after")).toBe("2");
    const body = (await res.json()) as { issues: Array<{ code: string; message: string }> };
    expect(body.issues[0]).toMatchObject({
      code: "DATABASE.UNAVAILABLE",
      message: "The database connection was lost; nothing was saved. Try again.",
    });
  });

  it("answers a refusal for a busy database with 503 and when to resend", async () => {
    const res = respond(fail("DATABASE.BUSY", "The records are busy; nothing was saved. Try again in a moment."));
    expect(res.status).toBe(503);
    expect(res.headers.get("retry-after")).toBe("2");
    expect(respond(fail("LEDGER.OVERDRAW", "m")).headers.get("retry-after")).toBeNull();
  });

  it("passes a handler's own answers through untouched", async () => {
    const route = handled("GET /api/example", async () => Response.json({ ok: true, value: 1 }));
    const res = await route(new Request("http://127.0.0.1/api/example"));
    expect(res.status).toBe(200);
  });
});
