import { describe, expect, it } from "vitest";
import { describeChange, isRecordHistoryKind, RECORD_HISTORIES } from "@/lib/audit/history";

// 21 CFR 11.10(e): an audit trail records the old and
// new values of a change. These checks pin how the history page shows them.
describe("describeChange", () => {
  it("shows every field of a creation with no old value", () => {
    expect(describeChange("", JSON.stringify({ code: "L-1", massG: 1200, source: { code: "R001" } }))).toEqual([
      { field: "code", before: null, after: "L-1" },
      { field: "massG", before: null, after: "1200" },
      { field: "source.code", before: null, after: "R001" },
    ]);
  });

  it("shows only the fields that differ for a change, with both sides", () => {
    const before = JSON.stringify({ status: "OPEN", closedAt: null, note: "same" });
    const after = JSON.stringify({ status: "CLOSED", closedAt: "2026-11-01T00:00:00.000Z", note: "same" });
    expect(describeChange(before, after)).toEqual([
      { field: "status", before: "OPEN", after: "CLOSED" },
      { field: "closedAt", before: "—", after: "2026-11-01T00:00:00.000Z" },
    ]);
  });

  it("shows a field removed by a change as gone", () => {
    expect(describeChange(JSON.stringify({ a: 1, b: 2 }), JSON.stringify({ a: 1 }))).toEqual([
      { field: "b", before: "2", after: null },
    ]);
  });

  it("keeps text that is not JSON as it was stored", () => {
    expect(describeChange("", "plain words")).toEqual([{ field: "value", before: null, after: "plain words" }]);
  });

  it("knows each record page's entities and refuses unknown kinds", () => {
    expect(RECORD_HISTORIES.lot.entities).toContain("Titration");
    expect(isRecordHistoryKind("lot")).toBe(true);
    expect(isRecordHistoryKind("toString")).toBe(false);
    expect(isRecordHistoryKind("")).toBe(false);
  });
});
