import { describe, expect, it } from "vitest";
import { GRID_TABLES } from "@/lib/grid/tables";
import type { GridRow } from "@/lib/grid/tables";
import type { SheetRow } from "@/lib/grid/sheet";
import {
  importKeyOf,
  markRefusedRows,
  MAX_MESSAGES,
  PREVIEW_ROWS,
  rowIssue,
  rowMessage,
  sortImportRows,
} from "@/lib/grid/import-match";

const sources = GRID_TABLES.sources;
const titrations = GRID_TABLES.titrations;
const row = (line: number, values: GridRow, errors: Record<string, string> = {}): SheetRow => ({
  line,
  values,
  errors,
  raw: {},
});
const STORED: GridRow = { code: "SRC-1", name: "Canal Street kitchen", kind: "RESTAURANT" };

describe("an import sorted against what is stored", () => {
  it("keys a row by its import key fields, in order", () => {
    expect(importKeyOf(sources, { code: "SRC-1", name: "x" })).toBe('"SRC-1"');
    expect(importKeyOf(titrations, { lotCode: "L-1", testedAt: "2026-01-02", sampleMassG: 5 })).toBe(
      '"L-1"|"2026-01-02"|5|null',
    );
  });

  it("names the row and, where it is one, the column", () => {
    expect(rowMessage(sources, 4, "name", "is required")).toBe('Row 4, column "Name": is required');
    expect(rowMessage(sources, 4, "", "broken quotes in this row")).toBe("Row 4: broken quotes in this row");
  });

  it("leaves a stored record alone, writes a new one, refuses a changed one and a second copy", () => {
    const out = sortImportRows(
      sources,
      [
        row(2, { ...STORED }),
        row(3, { code: "SRC-2", name: "Harbour diner" }),
        row(4, { code: "SRC-9", name: "Another name" }),
        row(5, { code: "SRC-2", name: "Harbour diner" }),
        row(6, { code: "SRC-3" }, { name: "Name is required" }),
      ],
      [STORED, { code: "SRC-9", name: "Mill yard" }],
      ['Unknown column: "Colour"'],
    );
    expect(out.fresh.map((r) => r.line)).toEqual([3]);
    expect(out.unchanged).toBe(1);
    expect(out.failed).toBe(3);
    expect(out.preview.map((p) => p.status)).toEqual(["unchanged", "new", "error", "error", "error"]);
    expect(out.messages).toEqual([
      'Unknown column: "Colour"',
      'Row 4, column "Name": differs from the stored record (stored Mill yard); stored records are not overwritten by an import',
      'Row 5, column "Code": the same record as row 3',
      'Row 6, column "Name": Name is required',
    ]);
  });

  it("keeps at most the first rows for the preview and a bounded list of messages", () => {
    const many = Array.from({ length: PREVIEW_ROWS + MAX_MESSAGES + 5 }, (_, i) =>
      row(i + 2, { code: `SRC-${i}` }, { name: "Name is required" }),
    );
    const out = sortImportRows(sources, many, [], []);
    expect(out.preview).toHaveLength(PREVIEW_ROWS);
    expect(out.messages).toHaveLength(MAX_MESSAGES);
    expect(out.failed).toBe(many.length);
  });

  it("re-addresses a service's refusal to the file's row and column", () => {
    expect(rowIssue(sources, 7, { code: "SOURCE.DUPLICATE", message: "code already used", field: "code" })).toEqual({
      code: "SOURCE.DUPLICATE",
      field: "rows.7.code",
      message: 'Row 7, column "Code": code already used',
    });
  });

  it("marks the refused rows of a preview with the message beside their cell", () => {
    const preview = sortImportRows(sources, [row(2, { code: "A" }), row(3, { code: "B" })], [], []).preview;
    const refused = markRefusedRows(preview, [
      rowIssue(sources, 3, { code: "SOURCE.REFUSED", message: "too long", field: "name" }),
      rowIssue(sources, 3, { code: "SOURCE.REFUSED", message: "unknown kind", field: "kind" }),
    ]);
    expect(refused).toBe(1);
    expect(preview[0]?.status).toBe("new");
    expect(preview[1]).toMatchObject({ status: "error", errors: { name: "too long", kind: "unknown kind" } });
  });
});
