import { describe, expect, it } from "vitest";
import { GRID_TABLES, entryColumns } from "@/lib/grid/tables";
import { readSheet } from "@/lib/grid/sheet";
import {
  applyValues,
  clearChanges,
  copyText,
  fillDownChanges,
  markSavedRows,
  pasteChanges,
  pasteTargets,
  REF,
  STATE,
  withTrailingBlank,
} from "@/lib/grid/drafts";
import type { DraftRow } from "@/lib/grid/drafts";

const table = GRID_TABLES.pickups;
const entry = new Set(entryColumns(table).map((c) => c.field));
const COLS = ["code", "sourceCode", "massKg", "notes"];
const draft = (ref: string, cells: Record<string, string> = {}): DraftRow => ({
  [REF]: ref,
  [STATE]: "draft",
  ...cells,
});
const saved = (ref: string, cells: Record<string, string> = {}): DraftRow => ({
  ...draft(ref, cells),
  [STATE]: "saved",
});
let n = 0;
const blank = () => draft(`new${++n}`);
const range = (top: number, left: number, bottom: number, right: number) => ({ top, left, bottom, right });

describe("draft rows worked out without the browser", () => {
  it("keeps one empty row at the end for the next row to be typed", () => {
    expect(withTrailingBlank([draft("a", { code: "PU-1" })], blank, entry, table)).toHaveLength(2);
    expect(withTrailingBlank([draft("a")], blank, entry, table)).toHaveLength(1);
    expect(withTrailingBlank([draft("a", { massKg: "3" })], blank, entry, table)).toHaveLength(1); // computed column
    expect(withTrailingBlank([saved("a")], blank, entry, table)).toHaveLength(2);
  });

  it("applies values to draft rows only, as text", () => {
    const { rows, touched } = applyValues(
      [draft("a"), saved("b")],
      [
        { rowId: "a", field: "containers", value: 3 },
        { rowId: "a", field: "massKg", value: 9 },
        { rowId: "b", field: "code", value: "X" },
        { rowId: "a", field: "notes", value: null },
      ],
      entry,
    );
    expect(rows[0]).toMatchObject({ containers: "3", notes: "" });
    expect(rows[0]?.massKg).toBeUndefined();
    expect(rows[1]?.code).toBeUndefined();
    expect([...touched]).toEqual(["a"]);
  });

  it("fills down from the top cell and clears only what can be typed", () => {
    const rows = [draft("a", { code: "PU-1", sourceCode: "SRC-1" }), draft("b"), saved("c")];
    expect(fillDownChanges(rows, range(0, 0, 2, 1), COLS, entry)).toEqual([
      { rowId: "b", field: "code", before: "", after: "PU-1" },
      { rowId: "b", field: "sourceCode", before: "", after: "SRC-1" },
    ]);
    expect(clearChanges(rows, range(0, 0, 1, 3), COLS, entry)).toEqual([
      { rowId: "a", field: "code", before: "PU-1", after: "" },
      { rowId: "a", field: "sourceCode", before: "SRC-1", after: "" },
    ]);
  });

  it("copies a rectangle as tab-separated lines", () => {
    const rows = [draft("a", { code: "PU-1", sourceCode: "SRC-1" }), draft("b", { code: "PU-2" })];
    expect(copyText(rows, range(0, 0, 1, 1), COLS)).toBe("PU-1\tSRC-1\nPU-2\t");
  });

  it("pastes over the empty last row, steps over saved rows and adds rows below", () => {
    const rows = [draft("a", { code: "PU-1" }), saved("s"), draft("z")];
    const t = pasteTargets(rows, 1, 3, blank, entry, table);
    expect(t.targets[0]).not.toBe("s");
    expect(t.base.map((r) => r[REF])).toEqual(["a", ...t.added, "s"]);
    expect(t.added).toHaveLength(3);
    const sheet = readSheet(table, "PU-9\tSRC-1\tUSED_COOKING_OIL", {
      locale: "en",
      system: "metric",
      siteOffsetMin: 0,
      delimiter: "\t",
      columnsWithoutHeader: entryColumns(table),
    });
    const changes = pasteChanges(sheet, t.base, t.targets, entry, "metric");
    expect(changes.slice(0, 3).map((c) => [c.rowId, c.field, c.after])).toEqual([
      [t.targets[0], "code", "PU-9"],
      [t.targets[0], "sourceCode", "SRC-1"],
      [t.targets[0], "material", "Used cooking oil"],
    ]);
  });

  it("shows a saved row as the server's record from then on", () => {
    const out = markSavedRows(
      [draft("a", { code: "pu-1" }), draft("b")],
      [{ ref: "a", row: { code: "PU-1", massKg: 812.5 } }],
      table,
      "metric",
    );
    expect(out[0]).toMatchObject({ [STATE]: "saved", code: "PU-1", massKg: "812.500" });
    expect(out[1]).toEqual(draft("b"));
  });
});
