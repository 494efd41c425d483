import { describe, it, expect } from "vitest";
import { MAX_CONCENTRATION_MOL_L, MAX_FFA_PCT, TitrationEntrySchema } from "@/lib/titration/titration.schema";

function issuesOf(input: unknown): Array<{ path: string; message: string }> {
  const r = TitrationEntrySchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
}

const valid = { sampleMassG: 28.2, titrant: "NAOH", concentrationMolL: 0.1, titreMl: 10 };

describe("TitrationEntrySchema", () => {
  it("exports its limits", () => {
    expect(MAX_CONCENTRATION_MOL_L).toBe(2);
    expect(MAX_FFA_PCT).toBe(100);
  });

  it("fills blank 0 and basis OLEIC by default", () => {
    expect(TitrationEntrySchema.parse(valid)).toEqual({ ...valid, blankMl: 0, basis: "OLEIC" });
  });

  it("accepts KOH, a blank and a palmitic basis", () => {
    expect(issuesOf({ ...valid, titrant: "KOH", blankMl: 0.05, basis: "PALMITIC" })).toEqual([]);
    expect(issuesOf({ ...valid, concentrationMolL: MAX_CONCENTRATION_MOL_L })).toEqual([]);
  });

  const bad: Array<{ name: string; input: unknown; path: string; message: RegExp }> = [
    {
      name: "sample mass 0",
      input: { ...valid, sampleMassG: 0 },
      path: "sampleMassG",
      message: /sample mass must be greater than 0 g/,
    },
    {
      name: "sample mass missing",
      input: { ...valid, sampleMassG: undefined },
      path: "sampleMassG",
      message: /sample mass must be a number \(g\)/,
    },
    {
      name: "titrant lower-case",
      input: { ...valid, titrant: "naoh" },
      path: "titrant",
      message: /titrant must be NAOH or KOH/,
    },
    {
      name: "concentration 0",
      input: { ...valid, concentrationMolL: 0 },
      path: "concentrationMolL",
      message: /greater than 0 mol\/L/,
    },
    {
      name: "concentration 2.5",
      input: { ...valid, concentrationMolL: 2.5 },
      path: "concentrationMolL",
      message: /at most 2 mol\/L/,
    },
    {
      name: "negative titre",
      input: { ...valid, titreMl: -1 },
      path: "titreMl",
      message: /titre must not be negative \(mL\)/,
    },
    {
      name: "titre as text",
      input: { ...valid, titreMl: "10" },
      path: "titreMl",
      message: /titre must be a number \(mL\)/,
    },
    {
      name: "negative blank",
      input: { ...valid, blankMl: -0.1 },
      path: "blankMl",
      message: /blank must not be negative \(mL\)/,
    },
    {
      name: "blank above titre",
      input: { ...valid, titreMl: 0.1, blankMl: 0.2 },
      path: "blankMl",
      message: /blank \(mL\) must not exceed the titre \(mL\)/,
    },
    {
      name: "unknown basis",
      input: { ...valid, basis: "STEARIC" },
      path: "basis",
      message: /basis must be OLEIC, PALMITIC or LAURIC/,
    },
  ];
  it.each(bad)("rejects $name on $path", ({ input, path, message }) => {
    const issues = issuesOf(input);
    expect(issues.find((i) => i.path === path)?.message).toMatch(message);
  });
});
