import { describe, expect, it } from "vitest";
import { numberStyleFor, parseLocaleNumber } from "@/lib/grid/locale-number";
import { dateOrderFor, parseDateCell } from "@/lib/grid/locale-date";
import { decodeText, readSheet } from "@/lib/grid/sheet";
import { matchHeaders, readCell } from "@/lib/grid/cells";
import { neutraliseFormula, unneutralise } from "@/lib/grid/formula";
import { toCsv } from "@/lib/grid/export";
import { GRID_TABLES, columnOf } from "@/lib/grid/tables";
import type { GridColumn } from "@/lib/grid/tables";
import { emptyHistory, record, redo, revertValues, undo } from "@/lib/grid/undo";
import { fillDown, rangeOf } from "@/lib/grid/selection";

const num = (text: string, locale: string) => {
  const r = parseLocaleNumber(text, numberStyleFor(locale));
  return r.ok ? r.value : `refused: ${r.issues[0]?.message ?? ""}`;
};

describe("numbers per locale (Unicode CLDR decimal and group symbols, via Intl)", () => {
  it.each([
    // [text, locale, value] — CLDR: en "." decimal / "," group; de "," decimal / "." group; fr "," decimal / U+202F group; de-CH "." decimal / "’" group
    ["1,234.5", "en-US", 1234.5],
    ["1234.5", "en-GB", 1234.5],
    ["1.234,5", "de-DE", 1234.5],
    ["12,5", "de-DE", 12.5],
    ["1\u202f234,5", "fr-FR", 1234.5],
    ["1 234,5", "fr-FR", 1234.5],
    ["1\u00a0234\u00a0567", "fr-FR", 1234567],
    ["1’234.5", "de-CH", 1234.5],
    ["-3.25", "en-US", -3.25],
    ["\u22123,25", "de-DE", -3.25], // U+2212 MINUS SIGN, as CLDR formats negatives in some locales
    ["1e3", "en-US", 1000],
  ])("%s in %s is %s", (text, locale, value) => {
    expect(num(text, locale)).toBe(value);
  });

  it.each([
    ["1,5", "en-US"], // a decimal comma under a point-decimal style is refused, never read as 15
    ["1.5", "de-DE"],
    ["1,23,4", "en-US"], // grouping must be in threes (CLDR group size 3 for these locales)
    ["12 kg", "en-US"],
    ["", "en-US"],
  ])("%s in %s is refused", (text, locale) => {
    expect(String(num(text, locale))).toMatch(/^refused/);
  });
});

describe("dates (ISO 8601 and local orders from CLDR)", () => {
  it("day/month order per locale", () => {
    expect(dateOrderFor("en-US")).toBe("MDY"); // CLDR en: M/d/y
    expect(dateOrderFor("en-GB")).toBe("DMY"); // CLDR en-GB: dd/MM/y
    expect(dateOrderFor("de-DE")).toBe("DMY"); // CLDR de: dd.MM.y
  });
  it.each([
    ["2026-03-01", "DMY", "2026-03-01T00:00:00.000Z"], // ISO 8601 calendar date, extended format
    ["2026-03-01T08:30", "MDY", "2026-03-01T08:30:00.000Z"], // ISO 8601 date and time, local time = site time (UTC here)
    ["2026-03-01 08:30:15", "DMY", "2026-03-01T08:30:15.000Z"], // RFC 3339 §5.6 allows a space for T
    ["2026-03-01T08:30:00+01:00", "DMY", "2026-03-01T07:30:00.000Z"], // ISO 8601 UTC offset
    ["2026-03-01T08:30:00Z", "DMY", "2026-03-01T08:30:00.000Z"],
    ["01.03.2026", "DMY", "2026-03-01T00:00:00.000Z"],
    ["3/1/2026 14:05", "MDY", "2026-03-01T14:05:00.000Z"],
    ["1/3/26", "DMY", "2026-03-01T00:00:00.000Z"], // two-digit years are 20xx (common practice)
  ] as const)("%s (%s) is %s", (text, order, iso) => {
    const r = parseDateCell(text, order, 0);
    expect(r.ok ? r.value : r.issues[0]?.message).toBe(iso);
  });
  it("site local time is turned into UTC", () => {
    const r = parseDateCell("2026-03-01 08:30", "DMY", 60);
    expect(r.ok && r.value).toBe("2026-03-01T07:30:00.000Z");
  });
  it.each(["2026-02-30", "31/31/2026", "2026-13-01", "yesterday", "2026-03-01 25:00"])("%s is refused", (text) => {
    expect(parseDateCell(text, "DMY", 0).ok).toBe(false);
  });
});

describe("units in headers and cells", () => {
  const pickups = GRID_TABLES.pickups;
  it("reads units from headers: L / gal, kg / lb, °C / °F", () => {
    const m = matchHeaders(pickups, ["Pickup no.", "Volume (gal)", "Oil temp. °F", "mass [lb]", "Bogus"]);
    expect(m.matches.map((x) => [x.column.field, x.unit ?? null])).toEqual([
      ["code", null],
      ["volumeL", "gal"],
      ["tempC", "°F"],
      ["massKg", "lb"],
    ]);
    expect(m.unknown).toEqual(["Bogus"]);
  });
  it("converts to kg, L, °C", () => {
    const ctx = { style: numberStyleFor("en-US"), order: "MDY" as const, siteOffsetMin: 0, system: "metric" as const };
    const volume = columnOf(pickups, "volumeL") as GridColumn;
    const temp = columnOf(pickups, "tempC") as GridColumn;
    const r1 = readCell(volume, "1", { ...ctx, unit: "gal" });
    expect(r1.ok && r1.value).toBeCloseTo(3.785411784, 9); // NIST HB 44 App. C: 1 US gal = 231 in³ = 3.785 411 784 L
    const r2 = readCell(temp, "212", { ...ctx, unit: "°F" });
    expect(r2.ok && r2.value).toBeCloseTo(100, 9); // NIST SP 811 §B.8: t/°C = (t/°F − 32)/1.8
    const r3 = readCell(temp, "20", { ...ctx, system: "us" });
    expect(r3.ok && r3.value).toBeCloseTo(-6.6667, 4); // a US user types °F
  });
});

describe("paste and CSV blocks (RFC 4180 via papaparse)", () => {
  const pickups = GRID_TABLES.pickups;
  const opts = { locale: "en-US", system: "metric" as const, siteOffsetMin: 0 };
  it("a tab-separated block without a header fills the columns from the focused one", () => {
    const cols = ["volumeL", "tempC"].map((f) => columnOf(pickups, f) as GridColumn);
    const s = readSheet(pickups, "1,200.5\t20\r\n300\t21.5\r\n", {
      ...opts,
      delimiter: "\t",
      columnsWithoutHeader: cols,
    });
    expect(s.hasHeader).toBe(false);
    expect(s.rows.map((r) => [r.values.volumeL, r.values.tempC])).toEqual([
      [1200.5, 20],
      [300, 21.5],
    ]);
  });
  it("quoted cells keep commas, doubled quotes and line breaks (RFC 4180 §2 rules 5–7)", () => {
    const s = readSheet(
      GRID_TABLES.sources,
      'Code,Name,Kind,Materials,Address\nK1,"Fry ""Shack""",restaurant,"used cooking oil, tallow","1 Row,\nQuillmoor"',
      opts,
    );
    expect(s.problems).toEqual([]);
    expect(s.rows[0]?.values).toMatchObject({
      code: "K1",
      name: 'Fry "Shack"',
      kind: "RESTAURANT",
      materials: "USED_COOKING_OIL, TALLOW",
      address: "1 Row,\nQuillmoor",
    });
    expect(s.rows[0]?.errors).toEqual({});
  });
  it("a decimal-comma sheet with semicolons (de) is read", () => {
    const s = readSheet(
      pickups,
      "Pickup no.;Source;Material;Observed;Containers;Volume (L);Oil temp. (°C)\nP1;R1;USED_COOKING_OIL;01.03.2026 08:00;2;1.234,5;19,5",
      { ...opts, locale: "de-DE" },
    );
    expect(s.problems).toEqual([]);
    expect(s.rows[0]?.values).toMatchObject({
      volumeL: 1234.5,
      tempC: 19.5,
      observedAt: "2026-03-01T08:00:00.000Z",
      containers: 2,
    });
  });
  it("names bad rows and columns, missing and unknown columns, empty input", () => {
    const s = readSheet(pickups, "Pickup no.,Source,Colour\nP1,R1,red", opts);
    expect(s.problems.join("\n")).toMatch(/Unknown column: "Colour"/);
    expect(s.problems.join("\n")).toMatch(/Missing columns: .*Material.*Observed/);
    expect(readSheet(pickups, "", opts).problems[0]).toMatch(/empty/);
    const q = readSheet(pickups, 'Pickup no.,Source\n"P1,R1\n', opts);
    expect(q.problems.join(" ")).toMatch(/Row \d+: a quoted cell is never closed/);
    const cells = readSheet(pickups, "Pickup no.,Containers\nP1,0\nP2,two", opts);
    expect(cells.rows[0]?.errors.containers).toMatch(/at least 1/);
    expect(cells.rows[1]?.errors.containers).toMatch(/not a number/);
  });
  it("decodes UTF-8 with BOM, and falls back to Latin-1 (Windows-1252) for other bytes", () => {
    expect(decodeText(new Uint8Array([0xef, 0xbb, 0xbf, 0x43, 0xc2, 0xb0])).text).toBe("C°");
    const latin = decodeText(new Uint8Array([0x54, 0x65, 0x6d, 0x70, 0x20, 0xb0, 0x43])); // "Temp °C" in ISO 8859-1: ° = 0xB0
    expect(latin).toEqual({ text: "Temp °C", encoding: "Latin-1 (Windows-1252)" });
  });
});

describe("formula injection (OWASP CSV Injection)", () => {
  it.each(["=1+1", "+SUM(A1)", "-2+3", "@cmd", "\tx"])("%s is neutralised and restored", (text) => {
    expect(neutraliseFormula(text)).toBe(`'${text}`);
    expect(unneutralise(neutraliseFormula(text))).toBe(text);
  });
  it("plain text and an apostrophe the user typed are left alone", () => {
    expect(neutraliseFormula("Kitchen")).toBe("Kitchen");
    expect(unneutralise("'quoted")).toBe("'quoted");
  });
  it("exported CSV neutralises text cells but keeps numbers as numbers", () => {
    const csv = toCsv(
      GRID_TABLES.sources,
      [{ code: "K1", name: '=HYPERLINK("x")', kind: "RESTAURANT", materials: "TALLOW", pickupEveryDays: -1 }],
      "metric",
      "UTC",
    );
    expect(csv.split("\r\n")[1]).toContain(`"'=HYPERLINK(""x"")"`);
    expect(csv.split("\r\n")[1]).toContain(",-1,");
  });
});

describe("undo history and fill-down", () => {
  it("one step per paste; undo reverts it whole, redo replays it", () => {
    let h = record(emptyHistory(), {
      label: "paste",
      changes: [
        { rowId: "a", field: "x", before: "", after: "1" },
        { rowId: "a", field: "x", before: "1", after: "2" },
      ],
    });
    const u = undo(h);
    expect(u && revertValues(u.step)).toEqual([
      { rowId: "a", field: "x", value: "1" },
      { rowId: "a", field: "x", value: "" },
    ]);
    h = u ? u.history : h;
    expect(redo(h)?.step.label).toBe("paste");
    expect(record(h, { label: "typed", changes: [{ rowId: "b", field: "y", before: "", after: "z" }] }).undone).toEqual(
      [],
    );
  });
  it("fills each column from the top of the range (one row: from the row above)", () => {
    const grid = [
      ["a", "b"],
      ["", ""],
      ["", ""],
    ];
    const at = (p: { row: number; col: number }) => grid[p.row]?.[p.col] ?? null;
    expect(
      fillDown(rangeOf({ row: 0, col: 0 }, { row: 2, col: 1 }), at).map((f) => [f.pos.row, f.pos.col, f.value]),
    ).toEqual([
      [1, 0, "a"],
      [2, 0, "a"],
      [1, 1, "b"],
      [2, 1, "b"],
    ]);
    expect(fillDown(rangeOf({ row: 1, col: 1 }, { row: 1, col: 1 }), at)).toEqual([
      { pos: { row: 1, col: 1 }, value: "b" },
    ]);
    expect(fillDown(rangeOf({ row: 0, col: 0 }, { row: 0, col: 0 }), at)).toEqual([]);
  });
});
