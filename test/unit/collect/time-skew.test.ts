import { describe, expect, it } from "vitest";
import { futureObservation, TIME_SKEW_FLAG_MS, timeSkew } from "@/lib/collect/time-skew";

const at = (iso: string) => new Date(iso);

describe("observed (phone) vs received (server) time flag — threshold is common practice, 1 h", () => {
  it("uses a one-hour threshold", () => {
    expect(TIME_SKEW_FLAG_MS).toBe(3_600_000);
  });
  it.each([
    ["sent at once", "2026-12-02T10:00:00Z", "2026-12-02T10:00:05Z", false],
    ["exactly at the threshold", "2026-12-02T10:00:00Z", "2026-12-02T11:00:00Z", false],
    ["one second over", "2026-12-02T10:00:00Z", "2026-12-02T11:00:01Z", true],
    ["phone 59 min ahead", "2026-12-02T10:59:00Z", "2026-12-02T10:00:00Z", false],
    ["phone 2 h ahead", "2026-12-02T12:00:00Z", "2026-12-02T10:00:00Z", true],
  ] as const)("%s", (_n, observed, received, flagged) => {
    expect(timeSkew(at(observed), at(received)).flag).toBe(flagged);
  });
  it("says which way and by how much", () => {
    const late = timeSkew(at("2026-12-02T06:00:00Z"), at("2026-12-02T09:20:00Z"));
    expect(late).toMatchObject({
      flag: true,
      kind: "RECEIVED_LATE",
      message: "Received 3 h 20 min after it was observed",
    });
    const days = timeSkew(at("2026-11-24T06:00:00Z"), at("2026-12-02T09:00:00Z"));
    expect(days).toMatchObject({ kind: "RECEIVED_LATE", message: "Received 8 d 3 h after it was observed" });
    const ahead = timeSkew(at("2026-12-02T12:30:00Z"), at("2026-12-02T10:00:00Z"));
    expect(ahead).toMatchObject({
      kind: "PHONE_AHEAD",
      message: "Phone time is 2 h 30 min ahead of the server's",
      gapMs: -9_000_000,
    });
  });
});

describe("pickups typed in the grid cannot be observed in the future", () => {
  const now = new Date("2026-11-20T10:00:00Z");
  it("refuses a time more than the flag threshold (1 h, common practice) after now, naming the gap", () => {
    expect(futureObservation("2026-11-20T13:30:00Z", now)).toBe(
      "Observed time is 3 h 30 min later than now; a pickup cannot be recorded before it happens",
    );
    expect(futureObservation(new Date("2026-11-22T10:00:00Z"), now)).toMatch(/^Observed time is 2 d later/);
  });
  it("accepts the past, now, and a clock up to the threshold ahead; leaves non-times to the schema", () => {
    expect(futureObservation("2026-11-19T10:00:00Z", now)).toBeNull();
    expect(futureObservation("2026-11-20T11:00:00Z", now)).toBeNull();
    expect(futureObservation("not a time", now)).toBeNull();
    expect(futureObservation(undefined, now)).toBeNull();
  });
});
