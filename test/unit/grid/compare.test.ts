import { describe, expect, it } from "vitest";
import { sameStored } from "@/lib/grid/compare";
import type { GridColumn, GridRow, GridTable } from "@/lib/grid/tables";
import { GRID_TABLES } from "@/lib/grid/tables";

// A small table of our own: one column of each kind the comparison treats differently.
const COLUMNS: GridColumn[] = [
  { field: "code", header: "Code", kind: "code", entry: true },
  { field: "massKg", header: "Mass", kind: "number", quantity: "mass", entry: true },
  { field: "tempC", header: "Temp.", kind: "number", quantity: "temperature", entry: true },
  { field: "ratio", header: "Ratio", kind: "number", entry: true },
  { field: "observedAt", header: "Observed", kind: "date", entry: true },
  { field: "tags", header: "Tags", kind: "list", entry: true },
  { field: "stock", header: "Stock", kind: "number", quantity: "mass", entry: true, computed: true },
  { field: "note", header: "Note", kind: "text" },
];
const TABLE: GridTable = { ...GRID_TABLES.pickups, columns: COLUMNS };
const STORED: GridRow = {
  code: "PU-1",
  massKg: 812.345,
  tempC: 41.25,
  ratio: 0.5,
  observedAt: "2026-12-01T08:00:00.000Z",
  tags: "C-1, C-2",
  stock: 10,
  note: "kept",
};

const diff = (values: GridRow) => sameStored(TABLE, { values }, STORED).map((d) => d.field);

describe("sameStored: is an imported row the stored record?", () => {
  it("the stored row itself matches", () => {
    expect(diff({ ...STORED })).toEqual([]);
  });
  it("masses match within the export's 3 decimals of kg (1 g), not beyond", () => {
    expect(diff({ massKg: 812.3455 })).toEqual([]);
    expect(diff({ massKg: 812.347 })).toEqual(["massKg"]);
  });
  it("temperatures match within the export's 2 decimals", () => {
    expect(diff({ tempC: 41.254 })).toEqual([]);
    expect(diff({ tempC: 41.27 })).toEqual(["tempC"]);
  });
  it("plain numbers match only to a relative 1e-9", () => {
    expect(diff({ ratio: 0.5 + 1e-12 })).toEqual([]);
    expect(diff({ ratio: 0.5001 })).toEqual(["ratio"]);
  });
  it("dates are compared as instants, whatever the zone they are written in", () => {
    expect(diff({ observedAt: "2026-12-01T09:00:00+01:00" })).toEqual([]);
    expect(diff({ observedAt: "2026-12-01T09:00:00Z" })).toEqual(["observedAt"]);
  });
  it("lists are compared as sets, ignoring order and spaces", () => {
    expect(diff({ tags: "C-2,C-1" })).toEqual([]);
    expect(diff({ tags: "C-1" })).toEqual(["tags"]);
  });
  it("cells left empty in the file, computed and non-entry columns are not compared", () => {
    expect(diff({ code: "", massKg: null, stock: 99, note: "changed" })).toEqual([]);
  });
  it("a changed code is reported with the stored value shown", () => {
    expect(sameStored(TABLE, { values: { code: "PU-2" } }, STORED)).toEqual([{ field: "code", stored: "PU-1" }]);
  });
  it("a value the stored row lacks is a difference", () => {
    expect(sameStored(TABLE, { values: { code: "PU-1" } }, {}).map((d) => d.field)).toEqual(["code"]);
  });
});
