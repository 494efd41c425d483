// The one table from a domain issue code to an HTTP status.
import type { DomainIssue } from "@/lib/core/result";

const BY_PREFIX: Array<[RegExp, number]> = [
  [/^INPUT\.TOO_LARGE$/, 413],
  [/^INPUT\./, 422],
  [/^RECORD\.NOT_FOUND$/, 404],
  [/^RECORD\.DUPLICATE$/, 409],
  [/^AUTH\.(UNAUTHENTICATED|BAD_CREDENTIALS)$/, 401],
  [/^AUTH\.RATE_LIMITED$/, 429],
  [/^AUTH\./, 403],
  [/^IDEMPOTENCY\.KEY_REUSED$/, 422],
  [/^IDEMPOTENCY\.KEY_(REQUIRED|INVALID)$/, 400],
  [/^IDEMPOTENCY\.IN_PROGRESS$/, 409],
  [/^PERIOD\.CLOSED$/, 409],
  // The database could not take the write just now (lock held too long, connection lost): retry.
  [/^DATABASE\.(BUSY|UNAVAILABLE)$/, 503],
  // Conflicts with the state of the books: over-draw, over-fill, a cycle, something already done.
  [/^LEDGER\.(OVERDRAW|OVERDRAW_IN_TIME|NOTHING_TO_MOVE|CYCLE)$/, 409],
  [/^TANK\.OVERFILL$/, 409],
  [/^LOT\.(NOT_ACCEPTED|SCREENING_HOLD)$/, 409],
  [/^CORRECTION\.ALREADY_(REVERSED|VOIDED)$/, 409],
  [/^(PRODUCT|LOT)\.(ALREADY_)?DECIDED$/, 409],
  [/^PICKUP\.ALREADY_RECEIVED$/, 409],
  [/^PERIOD\.ALREADY_CLOSED$/, 409],
  [/^WASTE\.(ALREADY_FULL|ALREADY_HAULED|CONTAINER_CLOSED)$/, 409],
  [/^(PRODUCT\.(ON_HOLD|NOT_RELEASED)|CUSTOMER\.INACTIVE)$/, 409],
  [/^PRODUCT\.(NOT_RELEASABLE|DECIDED|NO_SPEC|NO_DEVIATION)$/, 409],
  [/^SITESPEC\.(NAME_TAKEN|STALE)$/, 409],
  [/^BATCH\.(NOT_FINISHED|OUTPUT_CORRECTED)$/, 409],
  [/^SCREENING\.(ALREADY_DECIDED|NOT_CONFIRMED)$/, 409],
  [/^RECALL\.NOTHING_TO_HOLD$/, 409],
];

/** 422 for bad input, 404/409 for state conflicts; any other expected refusal is a 422 with its code. */
export function statusFor(issues: DomainIssue[]): number {
  const first = issues[0];
  if (!first) return 422;
  for (const [pattern, status] of BY_PREFIX) if (pattern.test(first.code)) return status;
  return 422;
}
