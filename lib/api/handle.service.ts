import "server-only";
import { NextResponse } from "next/server";
import { unstable_rethrow } from "next/navigation";
import { getSignedIn, requireRole } from "@/lib/auth/request.service";
import { idempotent, MAX_JSON_BYTES, readJson, requireSameOrigin, respond } from "@/lib/api/json-route.service";
import { getDb } from "@/lib/core/db";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import type { SiteRole } from "@/lib/core/vocabulary";
import type { Actor } from "@/lib/core/actor";
import { log, newReference } from "@/lib/log/log.service";
import { classifyDatabaseFault, FAULT_MESSAGES } from "@/lib/core/faults";

/** What a person is told when the server fails: a reference to pass on, no developer advice. */
export function unexpectedMessage(reference: string): string {
  return `Something went wrong on the server and nothing was saved. Tell your administrator this reference: ${reference}`;
}

/**
 * Wraps a route handler: an unexpected error becomes the JSON issue shape with status 500 and a short
 * reference, and the same reference goes to the log with the route, the user id and the stack.
 * Next's own control flow (redirect, notFound, forbidden) passes through untouched.
 */
export function handled<A extends [Request, ...unknown[]]>(
  route: string,
  fn: (...args: A) => Promise<Response>,
): (...args: A) => Promise<Response> {
  return async (...args: A): Promise<Response> => {
    try {
      return await fn(...args);
    } catch (error) {
      unstable_rethrow(error);
      const reference = newReference();
      // A read (or a write outside runInTransaction) caught by a lost connection or a held lock: retryable.
      const fault = classifyDatabaseFault(error);
      if (fault) {
        log.warn(
          { reference, route, method: args[0].method, event: "database.fault", code: fault, err: error },
          "a request was refused by a database fault",
        );
        return NextResponse.json(
          { ok: false, issues: [{ code: fault, message: FAULT_MESSAGES[fault], reference }] },
          { status: 503, headers: { "retry-after": "2" } },
        );
      }
      let userId: number | null = null;
      try {
        userId = (await getSignedIn())?.userId ?? null;
      } catch {
        userId = null;
      }
      log.error(
        { reference, route, method: args[0].method, userId, err: error },
        "unexpected error in a route handler",
      );
      return NextResponse.json(
        { ok: false, issues: [{ code: "SERVER.UNEXPECTED", message: unexpectedMessage(reference), reference }] },
        { status: 500 },
      );
    }
  };
}

/**
 * The write route every record type shares: same-origin check, the roles allowed, a JSON body within
 * its limit, and the service run under the caller's Idempotency-Key — wrapped like every route.
 */
export function recordingRoute<T>(
  route: string,
  roles: readonly SiteRole[],
  service: (db: Db, actor: Actor, input: unknown) => Promise<Result<T>>,
  limit = MAX_JSON_BYTES,
): (request: Request) => Promise<Response> {
  return handled(route, async (request: Request) => {
    const origin = requireSameOrigin(request);
    if (!origin.ok) return respond(origin);
    const who = await requireRole(roles);
    if (!who.ok) return respond(who);
    const body = await readJson(request, limit);
    if (!body.ok) return respond(body);
    const actor: Actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
    return respond(
      await idempotent(request, who.value.userId, body.value, async () => service(await getDb(), actor, body.value)),
    );
  });
}
