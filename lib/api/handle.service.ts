import "server-only";
import { NextResponse } from "next/server";
import { unstable_rethrow } from "next/navigation";
import { getSignedIn } from "@/lib/auth/request.service";
import { log, newReference } from "@/lib/log/log.service";

/** What a person is told when the server fails: a reference to pass on, no developer advice. */
export function unexpectedMessage(reference: string): string {
  return `Something went wrong on the server and nothing was saved. Tell your administrator this reference: ${reference}`;
}

/**
 * Wraps a route handler: an unexpected error becomes the JSON issue shape with status 500 and a short
 * reference, and the same reference goes to the log with the route, the user id and the stack.
 * Next's own control flow (redirect, notFound, forbidden) passes through untouched.
 */
export function handled<A extends [Request, ...unknown[]]>(route: string, fn: (...args: A) => Promise<Response>): (...args: A) => Promise<Response> {
  return async (...args: A): Promise<Response> => {
    try {
      return await fn(...args);
    } catch (error) {
      unstable_rethrow(error);
      const reference = newReference();
      let userId: number | null = null;
      try {
        userId = (await getSignedIn())?.userId ?? null;
      } catch {
        userId = null;
      }
      log.error({ reference, route, method: args[0].method, userId, err: error }, "unexpected error in a route handler");
      return NextResponse.json({ ok: false, issues: [{ code: "SERVER.UNEXPECTED", message: unexpectedMessage(reference), reference }] }, { status: 500 });
    }
  };
}
