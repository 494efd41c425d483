import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import { createTank, transferToTank } from "@/lib/tank/tank.service";
import { densityAt, DEFAULT_DENSITY_TABLE, requireDensityEntry } from "@/lib/quantity/density";

// A tank's capacity must hold under concurrent fills, as a lot's stock holds under concurrent draws:
// the check and the increment are one guarded statement, not a read followed by a write.
describe.each(PROVIDERS)("tank room under concurrent fills on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  // Mass capacity at 15 °C, as the tank store computes it (the service material's density).
  const capacityG = Math.floor(1_000 * densityAt(requireDensityEntry(DEFAULT_DENSITY_TABLE, "USED_COOKING_OIL"), 15));

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    const made = await createTank(t.db, plant.production, {
      code: "T9",
      name: "Day tank",
      service: "FEEDSTOCK",
      capacityL: 1_000,
    });
    if (!made.ok) throw new Error(JSON.stringify(made.issues));
    await acceptedLot(t.db, plant, { lot: "L-BIG", pickup: "PU-BIG", day: 2, volumeL: 3_000 });
  });
  afterAll(async () => {
    await t.drop();
  });

  it("lets in exactly what fits when twenty 100 kg transfers race for a 1,000 L tank", async () => {
    const tries = Array.from({ length: 20 }, (_, i) =>
      transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-BIG",
        toTankCode: "T9",
        at: `2026-02-03T08:${String(i).padStart(2, "0")}:00Z`,
        massKg: 100,
      }),
    );
    const results = await Promise.all(tries);
    const granted = results.filter((r) => r.ok).length;
    const refused = results.flatMap((r) => (r.ok ? [] : r.issues));
    const stock = (await t.db.holder.findFirstOrThrow({ where: { kind: "TANK", code: "T9" } })).stockG;
    expect(stock).toBeLessThanOrEqual(capacityG);
    expect(granted).toBe(Math.floor(capacityG / 100_000));
    expect(stock).toBe(granted * 100_000);
    expect(refused.length).toBe(20 - granted);
    for (const issue of refused) expect(issue).toMatchObject({ code: "TANK.OVERFILL", field: "massKg" });
    // The ledger agrees with the book stock: no movement was written for a refused fill.
    const into = await t.db.movement.aggregate({
      where: { toHolder: { kind: "TANK", code: "T9" } },
      _sum: { massG: true },
    });
    expect(into._sum.massG).toBe(stock);
  });
});
