// Answers kept by ledger position (lib/ledger/position.ts): a hit only at the same position, a sealed
// answer regardless of position, the oldest question dropped first, and the quarter-hour bucket.
import { describe, expect, it } from "vitest";
import { PositionCache, positionTag, quarterHourOf, samePosition } from "@/lib/ledger/position";

const at = (moveId: number, auditSeq: number, siteId = 1) => ({ siteId, moveId, auditSeq });

describe("PositionCache", () => {
  it("answers only at the position the answer was computed at", () => {
    const c = new PositionCache<string>(10);
    c.set("q", at(5, 9), "answer at 5/9");
    expect(c.get("q", at(5, 9))).toBe("answer at 5/9");
    expect(c.get("q", at(6, 10))).toBeUndefined(); // a movement booked
    expect(c.get("q", at(5, 10))).toBeUndefined(); // a change that moved no material (e.g. a gauge)
    expect(c.get("q", at(5, 9, 2))).toBeUndefined(); // another site
    expect(c.get("other", at(5, 9))).toBeUndefined();
  });

  it("keeps a sealed answer across positions, and only a sealed one", () => {
    const c = new PositionCache<string>(10);
    c.set("closed", at(5, 9), "closed quarter", "seal-1");
    c.set("open", at(5, 9), "open month");
    expect(c.getSealed("closed")).toEqual({ seal: "seal-1", value: "closed quarter" });
    expect(c.getSealed("open")).toBeUndefined();
  });

  it("drops the least recently used question beyond its size", () => {
    const c = new PositionCache<number>(2);
    c.set("a", at(1, 1), 1);
    c.set("b", at(1, 1), 2);
    expect(c.get("a", at(1, 1))).toBe(1); // a is now the most recent
    c.set("c", at(1, 1), 3);
    expect(c.size).toBe(2);
    expect(c.get("b", at(1, 1))).toBeUndefined();
    expect(c.get("a", at(1, 1))).toBe(1);
    expect(c.get("c", at(1, 1))).toBe(3);
  });
});

describe("positions and time buckets", () => {
  it("compares and names positions", () => {
    expect(samePosition(at(3, 4), at(3, 4))).toBe(true);
    expect(samePosition(at(3, 4), at(3, 5))).toBe(false);
    expect(positionTag(at(3, 4, 7))).toBe("7.3.4");
  });

  it("starts a new quarter-hour at every 15 minutes of UTC, so every zone's local midnight starts one", () => {
    expect(quarterHourOf(new Date("2026-12-05T09:14:59.999Z"))).toBe(quarterHourOf(new Date("2026-12-05T09:00:00Z")));
    expect(quarterHourOf(new Date("2026-12-05T09:15:00Z"))).toBe(quarterHourOf(new Date("2026-12-05T09:00:00Z")) + 1);
    // Local midnight at UTC+05:45 is 18:15 UTC the day before: a bucket boundary.
    expect(quarterHourOf(new Date("2026-12-04T18:15:00Z"))).toBe(quarterHourOf(new Date("2026-12-04T18:14:59Z")) + 1);
  });
});
