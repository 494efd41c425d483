import "server-only";
// ETags for GET reports, traces and exports from the ledger position: the tag names the site's position
// (last movement, audit head), the quarter-hour (answers whose defaults follow the date), the reader's
// role (the read matrix shapes some answers) and the address asked for. A client that sends the tag
// back in If-None-Match gets 304 with no body and the server computes nothing while the books stand.
import { createHash } from "node:crypto";
import { NextResponse } from "next/server";
import { respond } from "@/lib/api/json-route.service";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { positionTag, quarterHourOf, samePosition } from "@/lib/ledger/position";
import { getLedgerPosition } from "@/lib/ledger/position.store";
import { AnswerBytes } from "@/lib/api/answer-bytes";
import { SingleFlight } from "@/lib/core/single-flight";

/** Private: answers depend on who asks; no-cache: the browser checks back with the tag every time. */
const CACHE_CONTROL = "private, no-cache";

/** Answers as sent, by tag: up to 64 MB in all, none over 16 MB (answer-bytes.ts). */
const home = globalThis as unknown as { tracevatAnswerBytes?: AnswerBytes; tracevatAnswerFlights?: Flight };
const sent: AnswerBytes = (home.tracevatAnswerBytes ??= new AnswerBytes(64 * 1024 * 1024, 16 * 1024 * 1024));
/** Readers asking under the same tag while its answer is computed wait for that one computation. */
type Flight = SingleFlight<{ body: Uint8Array } | { refused: Result<never> }>;
const flights: Flight = (home.tracevatAnswerFlights ??= new SingleFlight());

/** Forgets every answer kept as sent (tests; after a database file is replaced). */
export function clearSentAnswers(): void {
  sent.clear();
}

function jsonAnswer(body: Uint8Array, tag: string): NextResponse {
  return new NextResponse(body as Uint8Array<ArrayBuffer>, {
    status: 200,
    headers: { "content-type": "application/json", etag: tag, "cache-control": CACHE_CONTROL },
  });
}

export function positionEtag(
  position: Parameters<typeof positionTag>[0],
  now: Date,
  role: string,
  url: URL,
  variant = "",
): string {
  const address = createHash("sha256")
    .update(
      `${url.pathname}?${[...url.searchParams]
        .sort(([a], [b]) => a.localeCompare(b))
        .map(([k, v]) => `${k}=${v}`)
        .join("&")}`,
    )
    .digest("base64url")
    .slice(0, 16);
  return `W/"${positionTag(position)}.${quarterHourOf(now)}.${role}${variant}.${address}"`;
}

/** Whether an If-None-Match header names this tag (a list, or "*"). */
export function etagMatches(ifNoneMatch: string | null, tag: string): boolean {
  if (ifNoneMatch === null) return false;
  const bare = (t: string) => t.trim().replace(/^W\//, "");
  return ifNoneMatch.split(",").some((t) => t.trim() === "*" || bare(t) === bare(tag));
}

/**
 * Answers a GET from the ledger position: 304 when the caller already holds the answer for this
 * position; the bytes sent for the same tag before, when another reader asked the same question while
 * the books stood; else the computed answer with its tag. The position is read before computing, and
 * again after: an answer overtaken by a booking that landed meanwhile is sent under the older tag (the
 * next request recomputes) but not kept. `variant` names anything else the answer depends on (units).
 */
export async function respondAtPosition<T>(
  request: Request,
  db: Db,
  who: { siteId: number; role: string; now: Date },
  compute: () => Promise<Result<T>>,
  variant = "",
): Promise<NextResponse> {
  const position = await getLedgerPosition(db, who.siteId);
  const tag = positionEtag(position, who.now, who.role, new URL(request.url), variant);
  if (etagMatches(request.headers.get("if-none-match"), tag))
    return new NextResponse(null, { status: 304, headers: { etag: tag, "cache-control": CACHE_CONTROL } });
  const kept = sent.get(tag);
  if (kept !== undefined) return jsonAnswer(kept, tag);
  const { value } = await flights.run(tag, async () => {
    const result = await compute();
    if (!result.ok) return { refused: result };
    const body = Buffer.from(JSON.stringify({ ok: true, value: result.value }));
    if (samePosition(await getLedgerPosition(db, who.siteId), position)) sent.set(tag, body);
    return { body };
  });
  return "body" in value ? jsonAnswer(value.body, tag) : respond(value.refused);
}

/** The same check for a response built elsewhere (CSV and spreadsheet exports). */
export async function checkEtag(
  request: Request,
  db: Db,
  who: { siteId: number; role: string; now: Date },
  variant = "",
): Promise<{ tag: string; notModified: NextResponse | null }> {
  const position = await getLedgerPosition(db, who.siteId);
  const tag = positionEtag(position, who.now, who.role, new URL(request.url), variant);
  const notModified = etagMatches(request.headers.get("if-none-match"), tag)
    ? new NextResponse(null, { status: 304, headers: { etag: tag, "cache-control": CACHE_CONTROL } })
    : null;
  return { tag, notModified };
}
