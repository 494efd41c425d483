import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { GRID_TABLES } from "@/lib/grid/tables";
import { codeOfChoice, matchHeaders, readCell, showCell } from "@/lib/grid/cells";
import { exportColumns, siteTimeOf, toCsv } from "@/lib/grid/export";
import { SOURCE_KINDS } from "@/lib/core/vocabulary";

const sources = GRID_TABLES.sources;
const pickups = GRID_TABLES.pickups;
const col = (table: typeof sources, field: string) => {
  const c = table.columns.find((x) => x.field === field);
  if (!c) throw new Error(field);
  return c;
};
const ctx = { style: { decimal: ".", group: "," }, order: "YMD", siteOffsetMin: 0, system: "metric" } as const;

describe("choices show their label and read back from label or code", () => {
  it("a kind shows as its label, a list of materials as labels", () => {
    expect(showCell(col(sources, "kind"), "CRUSHER", "metric")).toBe("Oilseed crusher");
    expect(showCell(col(sources, "materials"), "USED_COOKING_OIL, TALLOW", "metric")).toBe("Used cooking oil, Tallow");
  });
  it("a typed label becomes the stored code even where the words differ from the code", () => {
    expect(codeOfChoice(SOURCE_KINDS, "Oilseed crusher")).toBe("CRUSHER");
    expect(codeOfChoice(SOURCE_KINDS, "oilseed CRUSHER")).toBe("CRUSHER");
    expect(codeOfChoice(SOURCE_KINDS, "food processor")).toBe("FOOD_PROCESSOR");
    const r = readCell(col(sources, "kind"), "Oilseed crusher", ctx as never);
    expect(r.ok && r.value).toBe("CRUSHER");
    const list = readCell(col(sources, "materials"), "Used cooking oil; Tallow", ctx as never);
    expect(list.ok && list.value).toBe("USED_COOKING_OIL, TALLOW");
  });
  it("an unknown word stays as typed (upper-cased) so the shared schema can refuse it by name", () => {
    expect(codeOfChoice(SOURCE_KINDS, "bakery")).toBe("BAKERY");
  });
});

describe("export columns", () => {
  it("a choice gets a code column beside its label; a time gets a UTC column beside the site time", () => {
    const headers = exportColumns(pickups, "metric", "Europe/Berlin").map((c) => c.header);
    expect(headers).toContain("Material");
    expect(headers.indexOf("Material (code)")).toBe(headers.indexOf("Material") + 1);
    expect(headers.indexOf("Observed (UTC)")).toBe(headers.indexOf("Observed (site time: Europe/Berlin)") + 1);
  });
  it("site time follows daylight saving (IANA tz database: Central European Summer Time is UTC+2)", () => {
    expect(siteTimeOf("2026-07-01T09:00:00Z", "Europe/Berlin")?.text).toBe("2026-07-01 11:00");
    expect(siteTimeOf("2026-01-01T09:00:00Z", "Europe/Berlin")?.text).toBe("2026-01-01 10:00");
    expect(siteTimeOf("not a time", "Europe/Berlin")).toBeNull();
  });
  it("re-reading an export takes the code and the UTC instant, not their companions", () => {
    const csv = toCsv(
      pickups,
      [
        {
          code: "P-1",
          sourceCode: "R1",
          material: "TRAP_GREASE",
          observedAt: "2026-07-01T09:00:00.000Z",
          containers: 1,
          volumeL: 10,
          tempC: 20,
        },
      ],
      "metric",
      "Europe/Berlin",
    );
    const headers = Papa.parse<string[]>(csv).data[0] ?? [];
    const m = matchHeaders(pickups, headers);
    const read = (field: string) => headers[m.matches.find((x) => x.column.field === field)?.index ?? -1];
    expect(read("material")).toBe("Material (code)");
    expect(read("observedAt")).toBe("Observed (UTC)");
    expect(m.matches.filter((x) => x.column.field === "material")).toHaveLength(1);
    expect(m.unknown).toEqual([]);
  });
  it("two headers of the same kind for one column still both match (and the import names the repeat)", () => {
    const m = matchHeaders(pickups, ["Pickup no.", "Material", "Material"]);
    expect(m.matches.filter((x) => x.column.field === "material")).toHaveLength(2);
  });
});
