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
import { positionTag, quarterHourOf } from "@/lib/ledger/position";
import { getLedgerPosition } from "@/lib/ledger/position.store";

/** Private: answers depend on who asks; no-cache: the browser checks back with the tag every time. */
const CACHE_CONTROL = "private, no-cache";

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
 * position, else the computed answer with its tag. The position is read before computing, so a booking
 * that lands meanwhile only makes the tag older than the answer, and the next request recomputes.
 */
export async function respondAtPosition<T>(
  request: Request,
  db: Db,
  who: { siteId: number; role: string; now: Date },
  compute: () => Promise<Result<T>>,
): Promise<NextResponse> {
  const position = await getLedgerPosition(db, who.siteId);
  const tag = positionEtag(position, who.now, who.role, new URL(request.url));
  if (etagMatches(request.headers.get("if-none-match"), tag))
    return new NextResponse(null, { status: 304, headers: { etag: tag, "cache-control": CACHE_CONTROL } });
  const result = await compute();
  const res = respond(result);
  if (result.ok) {
    res.headers.set("etag", tag);
    res.headers.set("cache-control", CACHE_CONTROL);
  }
  return res;
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
