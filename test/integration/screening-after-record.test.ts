import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { thenScreen } from "@/lib/screening/screening.service";
import { listFlags } from "@/lib/screening/screening.store";
import { withIdempotencyKey } from "@/lib/ledger/transaction.store";

// A pickup sent from the phone arrives under its idempotency key; the source check that follows it is a
// write of its own and must commit (under the pickup's key it was answered as a replay and lost).
describe.each(PROVIDERS)("screening after a recorded pickup on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
  });
  afterAll(async () => {
    await t.drop();
  });

  it("raises the phone-distance flag for a pickup logged far away, under the request's idempotency key", async () => {
    const record = thenScreen(recordPickup, (saved) => ({ pickupCodes: [saved.code] }));
    const pickup = {
      code: "PU-FAR-1",
      sourceCode: "R1",
      material: "USED_COOKING_OIL",
      observedAt: "2026-03-01T10:00:00Z",
      containers: 1,
      volumeL: 80,
      tempC: 18,
      idempotencyKey: "0b7d3c1e-5a2f-4e8b-9c6d-1f2a3b4c5d6e",
      phoneDistanceBand: "FAR",
    };
    const ctx = { userId: plant.collector.userId, key: pickup.idempotencyKey, requestHash: "far" };
    const saved = await withIdempotencyKey(ctx, () => record(t.db, plant.collector, pickup));
    expect(saved.ok).toBe(true);
    const flags = await listFlags(t.db, plant.siteId);
    expect(flags.map((f) => [f.signal, f.subjectKey])).toContainEqual(["PHONE_FAR", "PU-FAR-1"]);
    // The resend gets the pickup's first answer and raises nothing twice.
    const again = await withIdempotencyKey(ctx, () => record(t.db, plant.collector, pickup));
    expect(again).toEqual(saved);
    expect((await listFlags(t.db, plant.siteId)).filter((f) => f.signal === "PHONE_FAR")).toHaveLength(1);
  });
});
