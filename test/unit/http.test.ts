import { describe, expect, it } from "vitest";
import { statusFor } from "@/lib/http";
import type { DomainIssue } from "@/lib/core/result";

// RFC 9110 §15: 409 Conflict for a request that conflicts with the current state of the resource,
// 413 Content Too Large, 422 for content that cannot be processed as sent (RFC 9110 §15.5.21).
describe("one table from issue code to HTTP status", () => {
  const cases: Array<[DomainIssue["code"], number]> = [
    ["INPUT.INVALID", 422],
    ["INPUT.TOO_LARGE", 413],
    ["RECORD.NOT_FOUND", 404],
    ["RECORD.DUPLICATE", 409],
    ["AUTH.UNAUTHENTICATED", 401],
    ["AUTH.FORBIDDEN", 403],
    ["AUTH.RATE_LIMITED", 429],
    ["IDEMPOTENCY.KEY_REQUIRED", 400],
    ["PERIOD.CLOSED", 409],
    ["LEDGER.OVERDRAW", 409],
    ["LEDGER.OVERDRAW_IN_TIME", 409],
    ["LEDGER.CYCLE", 409],
    ["TANK.OVERFILL", 409],
    ["CORRECTION.ALREADY_REVERSED", 409],
    ["PRODUCT.DECIDED", 409],
    ["BATCH.WASH_BELOW_WATER", 422],
    ["BATCH.NOT_FINISHED", 409],
    ["BATCH.OUTPUT_CORRECTED", 409],
    ["BATCH.UNBALANCED", 422],
    // RFC 9110 §15.5.2 401 for a missing or wrong sign-in, §15.6.4 503 for a temporary overload (safe to resend),
    // RFC 6585 §4 429 Too Many Requests.
    ["AUTH.BAD_CREDENTIALS", 401],
    ["DATABASE.BUSY", 503],
    ["DATABASE.UNAVAILABLE", 503],
    ["IDEMPOTENCY.KEY_INVALID", 400],
    ["IDEMPOTENCY.KEY_REUSED", 422],
    ["IDEMPOTENCY.IN_PROGRESS", 409],
    ["LEDGER.NOTHING_TO_MOVE", 409],
    ["LOT.NOT_ACCEPTED", 409],
    ["LOT.DECIDED", 409],
    ["CORRECTION.ALREADY_VOIDED", 409],
    ["PICKUP.ALREADY_RECEIVED", 409],
    ["PERIOD.ALREADY_CLOSED", 409],
    ["WASTE.ALREADY_HAULED", 409],
    ["PRODUCT.ON_HOLD", 409],
    ["CUSTOMER.INACTIVE", 409],
    ["PRODUCT.NOT_RELEASABLE", 409],
    ["SITESPEC.STALE", 409],
  ];
  it.each(cases)("%s → %i", (code, status) => {
    expect(statusFor([{ code, message: "m" }])).toBe(status);
  });
  it("an empty list is a 422, and the first issue decides", () => {
    expect(statusFor([])).toBe(422);
    expect(
      statusFor([
        { code: "LEDGER.OVERDRAW", message: "a" },
        { code: "INPUT.INVALID", message: "b" },
      ]),
    ).toBe(409);
  });
});
