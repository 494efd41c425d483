import { describe, expect, it } from "vitest";
import { DEFAULT_CLOSURE_TOLERANCE } from "@/lib/mass-balance/balance-rules";
import type { BalanceHolder, BalanceMove } from "@/lib/mass-balance/balance-types";
import { batchBalance, computeProcessView } from "@/lib/mass-balance/process-view";

const utc = (iso: string): number => Date.parse(iso);
const KG = 1000;
const JANUARY = { startMs: utc("2026-01-01T00:00:00Z"), endMs: utc("2026-02-01T00:00:00Z") };

// A fictional batch: 1 000 kg oil and 200 kg methanol in; 960 kg ester, 200 kg glycerol phase, 30 kg methanol out.
const move = (id: number, role: BalanceMove["role"], from: number | null, to: number, kg: number): BalanceMove => ({
  id,
  at: utc("2026-01-10T00:00:00Z") + id,
  fromHolderId: from,
  toHolderId: to,
  massG: kg * KG,
  role,
});
const BATCH: BalanceHolder = { id: 6, kind: "BATCH", siteId: 1, completedAt: utc("2026-01-12T00:00:00Z") };
const RUNNING: BalanceHolder = { id: 7, kind: "BATCH", siteId: 1, completedAt: null };
const MOVES = [
  move(1, "OIL", 3, 6, 1000),
  move(2, "METHANOL", 4, 6, 200),
  move(3, "ESTER", 6, 8, 960),
  move(4, "GLYCEROL_PHASE", 6, 9, 200),
  move(5, "RECOVERED_METHANOL", 6, 4, 30),
  move(6, "OIL", 3, 7, 500),
];

describe("a batch's process balance", () => {
  it("adds up what was charged and drawn off by role, with the unmeasured difference", () => {
    const b = batchBalance(BATCH, MOVES.slice(0, 5), true, DEFAULT_CLOSURE_TOLERANCE);
    expect(b).toMatchObject({
      inputsG: 1200 * KG,
      outputsG: 1190 * KG,
      imbalanceG: 10 * KG,
      inputsByRole: { OIL: 1000 * KG, METHANOL: 200 * KG },
      unusualRoles: [],
    });
  });

  it("names a role a batch does not usually take", () => {
    const b = batchBalance(BATCH, [move(1, "TRANSFER", 3, 6, 5)], true, DEFAULT_CLOSURE_TOLERANCE);
    expect(b?.unusualRoles).toEqual(["TRANSFER"]);
  });

  it("leaves out a batch nothing moved in that did not finish in the period", () => {
    expect(batchBalance(RUNNING, [], false, DEFAULT_CLOSURE_TOLERANCE)).toBeNull();
  });

  it("totals only the batches finished in the period and lists the running one apart", () => {
    const view = computeProcessView([BATCH, RUNNING], MOVES, JANUARY, DEFAULT_CLOSURE_TOLERANCE);
    expect(view.completed.map((b) => b.holderId)).toEqual([6]);
    expect(view.inProgress.map((b) => b.holderId)).toEqual([7]);
    expect([view.inputsG, view.outputsG, view.imbalanceG]).toEqual([1200 * KG, 1190 * KG, 10 * KG]);
  });
});
