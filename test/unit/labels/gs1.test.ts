import { describe, expect, it } from "vitest";
import { CHARACTER_SET_82, MAX_LOT_LENGTH, gs1LotElement } from "@/lib/labels/gs1";

// Source: GS1 General Specifications, AI (10) and Figure 7.11-1 character set 82.
describe("GS1 AI (10) batch/lot number", () => {
  it("character set 82 has exactly 82 characters, none repeated, and excludes space # $ @ [ \\ ] ^ ` { | } ~", () => {
    expect(CHARACTER_SET_82.length).toBe(82); // GS1 GS Figure 7.11-1
    expect(new Set(CHARACTER_SET_82).size).toBe(82);
    for (const c of " #$@[\\]^`{|}~") expect(CHARACTER_SET_82.includes(c), c).toBe(false);
    for (const c of "!\"%&'()*+,-./:;<=>?_") expect(CHARACTER_SET_82.includes(c), c).toBe(true);
  });

  it("allows at most 20 characters (format N2+X..20)", () => {
    expect(MAX_LOT_LENGTH).toBe(20); // GS1 GS, AI (10)
    expect(gs1LotElement("A".repeat(20))).toEqual({
      ok: true,
      value: { elementString: `(10)${"A".repeat(20)}`, lot: "A".repeat(20) },
    });
    const long = gs1LotElement("A".repeat(21));
    expect(long.ok).toBe(false);
    if (!long.ok) expect(long.issues[0]).toMatchObject({ code: "GS1.TOO_LONG", field: "lot" });
  });

  it.each([
    ["LOT-2026-0042", "(10)LOT-2026-0042"],
    ["l.1/a_b", "(10)l.1/a_b"],
    ["x%&'()*+,:;<=>?!\"", "(10)x%&'()*+,:;<=>?!\""],
  ])("encodes %s", (lot, element) => {
    const r = gs1LotElement(lot);
    expect(r.ok && r.value.elementString).toBe(element);
  });

  it.each([
    ["L 42", "a space at position 2"],
    ["L#42", '"#" at position 2'],
    ["Lé42", '"é" at position 2'],
    ["L42~", '"~" at position 4'],
  ])("refuses %s, naming the character", (lot, what) => {
    const r = gs1LotElement(lot, "lotCode");
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.issues[0]).toMatchObject({
        code: "GS1.CHARACTER",
        field: "lotCode",
        message: expect.stringContaining(what) as string,
      });
  });

  it("refuses an empty lot", () => {
    expect(gs1LotElement("").ok).toBe(false);
  });
});
