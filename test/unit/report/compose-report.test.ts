import { describe, expect, it } from "vitest";
import { composeReport, headerLines, periodDays } from "@/lib/report/report";

const ctx = {
  plant: "Demo plant",
  producedAt: new Date("2026-03-02T09:30:00Z"),
  producedBy: "Ana Quill",
  timeZone: "UTC",
};

describe("composeReport", () => {
  it("takes the plant, the producer, the time zone and the ledger position from where it was produced", () => {
    const doc = composeReport(
      { slug: "s", title: "T", subject: "Lot L-1", facts: [["Status", "accepted"]], notes: ["n"], tables: [] },
      ctx,
      { movements: 12, lastMoveId: 40 },
    );
    expect(doc.plant).toBe("Demo plant");
    expect(doc.producedBy).toBe("Ana Quill");
    expect(doc.ledger).toEqual({ movements: 12, lastMoveId: 40 });
    expect(doc.cautions).toEqual([]);
    expect(headerLines(doc)[3]).toEqual(["Ledger position", "12 movements, last movement no. 40"]);
  });

  it("keeps the cautions a report prints", () => {
    const doc = composeReport(
      { slug: "s", title: "T", subject: "x", facts: [], notes: [], cautions: ["Keep lids closed."], tables: [] },
      ctx,
      { movements: 0, lastMoveId: null },
    );
    expect(doc.cautions).toEqual(["Keep lids closed."]);
  });
});

describe("periodDays", () => {
  it("prints the last day as the day before the end, which is the start of the next day", () => {
    expect(periodDays(new Date("2026-01-01T00:00:00Z"), new Date("2026-02-01T00:00:00Z"), "UTC")).toBe(
      "2026-01-01 to 2026-01-31",
    );
  });
});
