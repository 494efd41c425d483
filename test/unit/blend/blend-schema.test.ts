import { describe, it, expect } from "vitest";
import { BlendRequestSchema, MAX_FFA_PCT } from "@/lib/blend/blend.schema";

const valid = {
  candidates: [
    { ref: "UCO-1", availableKg: 800, ffaPct: 1.2, waterPct: 0.05, costPerKg: 0.6, ageDays: 12 },
    { ref: "UCO-2", availableKg: 400, ffaPct: 0.4, waterPct: 0.02, costPerKg: 0.9, ageDays: 3 },
  ],
  targetKg: 1000,
  limits: { maxFfaPct: 1, maxWaterPct: 0.06 },
  objective: "MIN_COST",
};

function issuesOf(input: unknown) {
  const r = BlendRequestSchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
}

describe("BlendRequestSchema", () => {
  it("accepts a plain request", () => {
    expect(BlendRequestSchema.safeParse(valid).success).toBe(true);
  });

  const [first, second] = valid.candidates;
  it.each([
    [
      { ...valid, candidates: [{ ...first, ffaPct: MAX_FFA_PCT + 1 }, second] },
      "candidates.0.ffaPct",
      "FFA must be at most 100 %",
    ],
    [{ ...valid, candidates: [{ ...first, availableKg: -1 }, second] }, "candidates.0.availableKg", "0 kg or more"],
    [
      { ...valid, candidates: [first, { ...second, costPerKg: undefined }] },
      "candidates.1.costPerKg",
      "MIN_COST needs a cost",
    ],
    [{ ...valid, candidates: [first, { ...second, ref: "UCO-1" }] }, "candidates.1.ref", "listed twice"],
    [{ ...valid, targetKg: 0 }, "targetKg", "above 0 kg"],
    [{ ...valid, limits: { maxFfaPct: -1, maxWaterPct: 0.06 } }, "limits.maxFfaPct", "at least 0 %"],
    [{ ...valid, objective: "FASTEST" }, "objective", "Objective must be one of"],
    [{ ...valid, minDrawKg: 0 }, "minDrawKg", "above 0 kg"],
  ])("rejects %# at %s", (input, path, message) => {
    expect(issuesOf(input).some((i) => i.path === path && i.message.includes(message))).toBe(true);
  });

  it("does not need costs for the other objectives", () => {
    const candidates = valid.candidates.map(({ costPerKg: _cost, ...rest }) => rest);
    expect(BlendRequestSchema.safeParse({ ...valid, candidates, objective: "OLDEST_FIRST" }).success).toBe(true);
  });
});
