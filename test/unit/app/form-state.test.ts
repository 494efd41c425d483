import { describe, expect, it } from "vitest";
import { IDLE, refused, saved, toFormErrors, toNumber } from "@/app/_ui/kit/form-state";

describe("what a form sends back", () => {
  it("a save carries its message, the values to show again (none by default) and a new sequence number", () => {
    const first = saved(IDLE, "Lot L-0001 received.");
    expect(first).toEqual({ status: "saved", message: "Lot L-0001 received.", values: {}, errors: {}, seq: 1 });
    const second = saved(first, "Kept.", { from: "2026-10-01" });
    expect(second.values).toEqual({ from: "2026-10-01" });
    expect(second.seq).toBe(2);
  });

  it("a refusal puts each message beside its field, keeps what was typed, and says the rest in the message", () => {
    const typed = { massKg: "12,5x", tankCode: "T9" };
    const r = refused(
      IDLE,
      typed,
      [
        { code: "FORM.INVALID", message: "Mass (kg) must be a number.", field: "massKg" },
        { code: "FORM.INVALID", message: "Mass (kg) is required.", field: "massKg" },
        { code: "TANK.FULL", message: "Tank T9 has no room." },
      ],
      ["massKg", "tankCode"],
    );
    expect(r.status).toBe("refused");
    expect(r.values).toBe(typed);
    expect(r.errors).toEqual({ massKg: "Mass (kg) must be a number." });
    expect(r.message).toBe("Tank T9 has no room.");
  });

  it("a refusal naming only fields asks to check the marked fields; unknown fields fall to the message", () => {
    const { errors, general } = toFormErrors(
      [{ code: "FORM.INVALID", message: "Row 2: lot is required.", field: "charges.1.lot" }],
      ["lot"],
      (f) => f.split(".").at(-1) ?? f,
    );
    expect(errors).toEqual({ lot: "Row 2: lot is required." });
    expect(general).toEqual([]);
    expect(
      refused(IDLE, {}, [{ code: "FORM.INVALID", message: "Lot is required.", field: "lot" }], ["lot"]).message,
    ).toBe("Not saved: check the marked fields.");
  });

  it("reads a typed number: empty is missing, a decimal comma is a point, anything else stays not a number", () => {
    expect(toNumber("")).toBeUndefined();
    expect(toNumber(" 12,5 ")).toBe(12.5);
    expect(toNumber("7.05")).toBe(7.05);
    expect(toNumber("12 kg")).toBeNaN();
  });
});
