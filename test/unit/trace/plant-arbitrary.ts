import fc from "fast-check";
import type { HolderKind, Mixing, TraceHolder, TraceMove } from "@/lib/ledger/moves";
import type { History } from "./arbitraries";

// A small plant: pickups and lots take material in, tanks mix it (and take back what batches return),
// batches draw from tanks, product lots, shipments, waste and a loss holder take what leaves.
const PLANT: Array<{ id: number; kind: HolderKind }> = [
  { id: 1, kind: "PICKUP" },
  { id: 2, kind: "PICKUP" },
  { id: 3, kind: "LOT" },
  { id: 4, kind: "LOT" },
  { id: 5, kind: "TANK" },
  { id: 6, kind: "TANK" },
  { id: 7, kind: "TANK" },
  { id: 8, kind: "BATCH" },
  { id: 9, kind: "BATCH" },
  { id: 10, kind: "PRODUCT_LOT" },
  { id: 11, kind: "WASTE_CONTAINER" },
  { id: 12, kind: "SHIPMENT" },
  { id: 13, kind: "DISPOSAL" },
  { id: 14, kind: "LOSS" },
];

interface PlantStep {
  entry: boolean;
  from: number;
  to: number;
  permille: number;
  massG: number;
  dt: number;
}

const permilleArb = fc.oneof(
  fc.integer({ min: 1, max: 1000 }),
  fc.constant(1000), // drain to zero
  fc.integer({ min: 1, max: 20 }), // a small draw off a large mixture: rounding decides who gets the gram
);

const plantStepArb: fc.Arbitrary<PlantStep> = fc.record({
  entry: fc.integer({ min: 0, max: 9 }).map((x) => x < 3),
  from: fc.nat({ max: PLANT.length - 1 }),
  to: fc.nat({ max: PLANT.length - 1 }),
  permille: permilleArb,
  massG: fc.oneof(fc.integer({ min: 1, max: 50 }), fc.integer({ min: 1, max: 50_000 })),
  dt: fc.nat({ max: 2 }),
});

/**
 * Random plant ledgers that never overdraw and hold no cycle in the ledger's sense (lib/ledger/cycle):
 * a holder other than a tank receives nothing once it has sent material, so no chain of moves brings a
 * holder's output back into it. Tanks receive and send freely (tank → batch → tank is allowed).
 */
export const plantHistoryArb: fc.Arbitrary<History> = fc
  .record({
    mixing: fc.array(fc.constantFrom<Mixing>("MIXED", "MIXED", "FIFO"), {
      minLength: PLANT.length,
      maxLength: PLANT.length,
    }),
    steps: fc.array(plantStepArb, { minLength: 1, maxLength: 120, size: "large" }),
  })
  .map(({ mixing, steps }) => {
    const holders: TraceHolder[] = PLANT.map((h, i) => ({ ...h, mixing: mixing[i] ?? "MIXED" }));
    const stock = PLANT.map(() => 0);
    const sent = PLANT.map(() => false);
    const reusable = (i: number) => PLANT[i]?.kind === "TANK";
    const moves: TraceMove[] = [];
    let id = 0;
    let at = 0;
    for (const s of steps) {
      id += 1;
      at += s.dt * 1000;
      const to = s.to === s.from ? (s.from + 1) % PLANT.length : s.to;
      const held = stock[s.from] ?? 0;
      if (s.entry || held === 0) {
        if (sent[s.from] === true && !reusable(s.from)) continue;
        moves.push({ id, at, fromHolderId: null, toHolderId: PLANT[s.from]?.id ?? 0, massG: s.massG });
        stock[s.from] = held + s.massG;
        continue;
      }
      if (sent[to] === true && !reusable(to)) continue;
      const massG = Math.max(1, Math.floor((held * s.permille) / 1000));
      moves.push({ id, at, fromHolderId: PLANT[s.from]?.id ?? 0, toHolderId: PLANT[to]?.id ?? 0, massG });
      stock[s.from] = held - massG;
      stock[to] = (stock[to] ?? 0) + massG;
      sent[s.from] = true;
    }
    return { holders, moves };
  });
