import { describe, expect, it } from "vitest";
import type { FlowDestination } from "@/lib/feedstock/lot-detail.store";
import { heldByKind } from "@/app/lots/[code]/where-it-is";

let nextId = 1;
const at = new Date("2026-10-01T08:00:00Z");
function place(kind: FlowDestination["holder"]["kind"], heldG: number | null): FlowDestination {
  const id = nextId++;
  return { holder: { id, kind, code: `${kind}-${id}` }, receivedG: 5_000, heldG, firstAt: at };
}

describe("where a lot's material is held now, by kind of place", () => {
  it("sums places of one kind, largest kind first, and adds what is still in the lot to the total", () => {
    const { rows, totalG } = heldByKind({
      stillInLotG: 1_000,
      destinations: [place("TANK", 2_000), place("PRODUCT_LOT", 3_500), place("TANK", 1_000)],
    });
    expect(rows).toEqual([
      { kind: "PRODUCT_LOT", places: 1, heldG: 3_500 },
      { kind: "TANK", places: 2, heldG: 3_000 },
    ]);
    expect(totalG).toBe(7_500);
  });

  it("leaves out places that hold none of it, and places of a time-ordered flow (no share known)", () => {
    const { rows, totalG } = heldByKind({
      stillInLotG: 250,
      destinations: [place("TANK", 0), place("BATCH", null)],
    });
    expect(rows).toEqual([]);
    expect(totalG).toBe(250);
  });
});
