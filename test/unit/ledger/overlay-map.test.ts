import { describe, expect, it } from "vitest";
import { withChanges } from "@/lib/ledger/overlay-map";

describe("withChanges", () => {
  it("reads as a copy with the changes set, and leaves the map it started from alone", () => {
    const base = new Map([
      [1, "a"],
      [2, "b"],
    ]);
    const next = withChanges(base, [
      [2, "B"],
      [3, "c"],
    ]);
    expect(next.get(2)).toBe("B");
    expect(next.get(3)).toBe("c");
    expect(next.has(1)).toBe(true);
    expect(next.size).toBe(3);
    expect(new Map(next)).toEqual(
      new Map([
        [1, "a"],
        [2, "B"],
        [3, "c"],
      ]),
    );
    expect(base.get(2)).toBe("b");
    expect(base.size).toBe(2);
  });

  it("stays a few layers deep over many bookings, flattened through the given function", () => {
    let flattened = 0;
    const flatten = (flat: Map<number, number>) => {
      flattened++;
      return flat;
    };
    let m: ReadonlyMap<number, number> = new Map([[0, 0]]);
    const copy = new Map(m);
    for (let i = 1; i <= 100; i++) {
      m = withChanges(
        m,
        [
          [i, i],
          [0, i],
        ],
        flatten,
      );
      copy.set(i, i).set(0, i);
    }
    expect(new Map(m)).toEqual(copy);
    expect(m.size).toBe(101);
    expect(flattened).toBe(20);
    // A read walks at most a few layers: the depth is bounded (flattened past it).
    expect((m as unknown as { depth?: number }).depth ?? 0).toBeLessThanOrEqual(4);
  });
});
