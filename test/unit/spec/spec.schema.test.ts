import { describe, expect, it } from "vitest";
import { loadEdition } from "@/lib/spec/spec.schema";
import { ASTM_D6751_23A } from "@/lib/spec/editions/astm-d6751-23a";

const row = {
  key: "acid-number",
  label: "Acid number",
  method: "ASTM D664",
  unit: "mg KOH/g",
  kind: "limit",
  max: 0.5,
  required: true,
  confidence: "published",
  source: "ASTM D6751-23a Table 1",
};
const table = { key: "test-edition", title: "Test", edition: "Test-1", grades: [{ key: "g", grade: "G" }], rules: [] };

describe("edition table schema", () => {
  it("loads the built-in table", () => {
    expect(loadEdition(ASTM_D6751_23A)).toHaveLength(6);
  });
  it("names the property of a malformed row", () => {
    expect(() => loadEdition({ ...table, rows: [row, { ...row, key: "free-glycerin", max: "0.02" }] })).toThrow(
      /test-edition.*property free-glycerin.*max/,
    );
    expect(() => loadEdition({ ...table, rows: [{ ...row, max: undefined }] })).toThrow(
      /property acid-number.*min or max/,
    );
    expect(() => loadEdition({ ...table, rows: [{ ...row, kind: "class", max: undefined }] })).toThrow(
      /property acid-number.*classMax/,
    );
    expect(() => loadEdition({ ...table, rows: [{ ...row, min: 1 }] })).toThrow(
      /property acid-number.*min is above max/,
    );
  });
  it("refuses a duplicate property in a grade, an unknown grade and a rule on an absent property", () => {
    expect(() => loadEdition({ ...table, rows: [row, row] })).toThrow(/acid-number appears twice/);
    expect(() => loadEdition({ ...table, rows: [{ ...row, grades: ["x"] }] })).toThrow(/unknown grade x/);
    expect(() =>
      loadEdition({
        ...table,
        rows: [row],
        rules: [
          {
            key: "r",
            label: "R",
            source: "S",
            anyOf: [
              { property: "acid-number", max: 1 },
              { property: "methanol", max: 1 },
            ],
          },
        ],
      }),
    ).toThrow(/rule r names property methanol/);
  });
});
