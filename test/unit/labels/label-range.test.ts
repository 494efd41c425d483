import { describe, expect, it } from "vitest";
import { MAX_LABELS_PER_SHEET, containerRange, readScanned } from "@/lib/labels/label-range";

describe("container label runs", () => {
  it("pads numbers and upper-cases the prefix", () => {
    expect(containerRange("c-", 8, 11)).toEqual({ ok: true, value: ["C-0008", "C-0009", "C-0010", "C-0011"] });
  });
  it.each<[string, number, number, string]>([
    ["C-", 5, 4, "to"],
    ["C-", -1, 4, "from"],
    ["C-", 1, MAX_LABELS_PER_SHEET + 1, "to"],
    ["C #", 1, 2, "prefix"],
  ])("refuses %s %i–%i naming %s", (prefix, from, to, field) => {
    const r = containerRange(prefix, from, to);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]?.field).toBe(field);
  });
});

describe("reading a scanned label", () => {
  const origin = "https://plant.example";
  it.each([
    ["https://plant.example/lots/L-1", { path: "/lots/L-1" }],
    ["https://elsewhere.example/lots/L-1", null],
    ["(10)l-0042", { code: "L-0042" }], // GS1 element string with AI (10)
    ["  c-0012 ", { code: "C-0012" }],
    ["", null],
  ])("%s", (text, expected) => {
    expect(readScanned(text, origin)).toEqual(expected);
  });
});
