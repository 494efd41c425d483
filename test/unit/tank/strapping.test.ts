import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { gaugeVsBook, massOfVolume, parseStrapping, strappingProblems, volumeAtLevel } from "@/lib/tank/strapping";
import type { StrappingTable } from "@/lib/tank/strapping";
import { DEFAULT_DENSITY_TABLE, densityAt, requireDensityEntry } from "@/lib/quantity/density";

// Reading a tank calibration (strapping) table between its rows by straight-line interpolation is
// common practice; API MPMS Chapter 2 covers how such tables are made (no clause cited here).
// Hand-made table: a vertical tank whose lowest 100 mm (the dished bottom) hold 300 L, then 25 L per 10 mm.
const TABLE: StrappingTable = [
  [0, 0],
  [100, 300],
  [1100, 2800],
  [2100, 5300],
];

const value = <T>(r: { ok: true; value: T } | { ok: false; issues: unknown }): T => {
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.value;
};

describe("volumeAtLevel (linear between calibration rows, common practice)", () => {
  it("returns the table's own volume at a listed level", () => {
    expect(value(volumeAtLevel(TABLE, 0))).toBe(0);
    expect(value(volumeAtLevel(TABLE, 1100))).toBe(2800);
    expect(value(volumeAtLevel(TABLE, 2100))).toBe(5300);
  });

  it("interpolates between rows by hand-worked figures", () => {
    expect(value(volumeAtLevel(TABLE, 50))).toBeCloseTo(150, 9); // half of the first step
    expect(value(volumeAtLevel(TABLE, 600))).toBeCloseTo(300 + 0.5 * 2500, 9); // 1,550 L
    expect(value(volumeAtLevel(TABLE, 1340))).toBeCloseTo(2800 + 0.24 * 2500, 9); // 3,400 L
  });

  it("refuses a level outside the table, naming the level field", () => {
    const below = volumeAtLevel(TABLE, -1);
    const above = volumeAtLevel(TABLE, 2101);
    expect(below.ok || above.ok).toBe(false);
    if (!above.ok) expect(above.issues[0]).toMatchObject({ code: "TANK.LEVEL_OUTSIDE_TABLE", field: "levelMm" });
    if (!above.ok) expect(above.issues[0]?.message).toContain("0 and 2100 mm");
  });

  it("never leaves the bracketing rows' volumes and rises with the level", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 2100 }), fc.integer({ min: 0, max: 2100 }), (a, b) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        const vLo = value(volumeAtLevel(TABLE, lo));
        const vHi = value(volumeAtLevel(TABLE, hi));
        expect(vLo).toBeGreaterThanOrEqual(0);
        expect(vHi).toBeLessThanOrEqual(5300);
        expect(vHi).toBeGreaterThanOrEqual(vLo);
      }),
      { numRuns: 300 },
    );
  });
});

describe("calibration tables as typed and stored", () => {
  it("accepts a rising table and reads it back from JSON", () => {
    expect(strappingProblems(TABLE)).toEqual([]);
    expect(parseStrapping(JSON.stringify(TABLE))).toEqual(TABLE);
  });

  it("refuses levels that do not rise, falling volumes, short or malformed tables", () => {
    expect(
      strappingProblems([
        [0, 0],
        [100, 300],
        [100, 400],
      ]),
    ).toEqual(["row 3: levels must rise from row to row"]);
    expect(
      strappingProblems([
        [0, 0],
        [100, 300],
        [200, 250],
      ]),
    ).toEqual(["row 3: volume must not fall as the level rises"]);
    expect(strappingProblems([[0, 0]])).toEqual(["a calibration table needs at least two rows"]);
    expect(strappingProblems([[0, 0], [100]])).toHaveLength(1);
    expect(parseStrapping("")).toBeNull();
    expect(parseStrapping("not json")).toBeNull();
    expect(parseStrapping("[[0,0],[10,-1]]")).toBeNull();
  });
});

describe("massOfVolume (volume observed at a temperature → mass)", () => {
  // Used cooking oil from the default density table (lib/quantity/density.ts): ρ15 918.2 kg/m³,
  // slope −0.64 kg/m³/K (JAOCS 76:1415–1419 (1999)); m = V·ρ(t).
  const uco = requireDensityEntry(DEFAULT_DENSITY_TABLE, "USED_COOKING_OIL");

  it("uses the table density at the observed temperature when no lot density is given", () => {
    const r = value(massOfVolume({ volumeL: 1000, tempC: 40, entry: uco }));
    expect(r.densityKgM3).toBeCloseTo(densityAt(uco, 40), 9);
    expect(r.densityKgM3).toBeCloseTo(918.2 - 0.64 * 25, 9); // 902.2 kg/m³
    expect(r.massG).toBe(902_200);
  });

  it("starts from a lot's own density at 15 °C and keeps the table's slope", () => {
    // A lot measured at 921.0 kg/m³ at 15 °C, moved at 55 °C: ρ = 921.0 − 0.64 × 40 = 895.4 kg/m³.
    const r = value(massOfVolume({ volumeL: 250, tempC: 55, entry: uco, densityKgM3: 921.0, referenceTempC: 15 }));
    expect(r.densityKgM3).toBeCloseTo(895.4, 9);
    expect(r.referenceDensityKgM3).toBeCloseTo(921.0, 9);
    expect(r.massG).toBe(223_850);
  });

  it("refuses a negative volume on the volume field", () => {
    const r = massOfVolume({ volumeL: -1, tempC: 20, entry: uco });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]?.field).toBe("volumeL");
  });
});

describe("gaugeVsBook", () => {
  it("gives gauge − book in grams and percent of book", () => {
    expect(gaugeVsBook(10_100_000, 10_000_000)).toEqual({ differenceG: 100_000, differencePct: 1 });
    expect(gaugeVsBook(9_950_000, 10_000_000).differencePct).toBeCloseTo(-0.5, 12);
    expect(gaugeVsBook(5_000, 0)).toEqual({ differenceG: 5_000, differencePct: null });
  });
});
