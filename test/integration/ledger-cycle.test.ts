import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import { at, createTestPlant } from "./support/plant";
import type { TestPlant } from "./support/plant";
import { createHolder, postMovement } from "@/lib/ledger/ledger.store";
import { runInTransaction } from "@/lib/ledger/transaction.store";
import type { MovementDraft } from "@/lib/ledger/ledger.store";

// Issue #4, bad input: a movement that would create a cycle in the genealogy is refused with a clear
// reason and nothing is saved. Hand-built: lot L → batch B (day 2) → product lot P (day 3), then P → L
// (day 4) and L → B again (day 3, 10:00). A move P → L back-dated to day 3, 09:00 would let B's output
// come back into L before L's second charge into B: B and L would become their own ancestors.
describe.each(PROVIDERS)("cycle guard on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  const ids = { lot: 0, batch: 0, product: 0, tank: 0 };
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    const r = await runInTransaction(t.db, async (tx) => {
      ids.lot = await createHolder(tx, plant.siteId, "LOT", "L-CY");
      ids.batch = await createHolder(tx, plant.siteId, "BATCH", "B-CY");
      ids.product = await createHolder(tx, plant.siteId, "PRODUCT_LOT", "P-CY");
      ids.tank = await createHolder(tx, plant.siteId, "TANK", "T-CY");
      const move = (d: Omit<MovementDraft, "siteId" | "recordedById">) =>
        postMovement(tx, { siteId: plant.siteId, recordedById: plant.production.userId, ...d });
      await move({
        at: at("2026-01-01T08:00:00Z"),
        role: "RECEIPT",
        fromHolderId: null,
        toHolderId: ids.lot,
        massG: 100_000,
      });
      await move({
        at: at("2026-01-02T08:00:00Z"),
        role: "OIL",
        fromHolderId: ids.lot,
        toHolderId: ids.batch,
        massG: 60_000,
      });
      await move({
        at: at("2026-01-03T08:00:00Z"),
        role: "ESTER",
        fromHolderId: ids.batch,
        toHolderId: ids.product,
        massG: 50_000,
      });
    });
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
  });
  afterAll(async () => {
    await t.drop();
  });

  const attempt = (d: Omit<MovementDraft, "siteId" | "recordedById">) =>
    runInTransaction(t.db, (tx) =>
      postMovement(tx, { siteId: plant.siteId, recordedById: plant.production.userId, ...d }),
    );

  it("refuses a back-dated move that would make a lot its own ancestor, and saves nothing", async () => {
    const before = await t.db.movement.count();
    // P → L on day 4 is not a cycle: nothing L receives on day 4 reaches B, which drew from L earlier …
    const ok = await attempt({
      at: at("2026-01-04T08:00:00Z"),
      role: "TRANSFER",
      fromHolderId: ids.product,
      toHolderId: ids.lot,
      massG: 1_000,
    });
    expect(ok.ok).toBe(true);
    // … but P → L booked on day 3 at 09:00, before a second charge of L into B on day 3 at 10:00, is.
    const charge = await attempt({
      at: at("2026-01-03T10:00:00Z"),
      role: "OIL",
      fromHolderId: ids.lot,
      toHolderId: ids.batch,
      massG: 1_000,
    });
    expect(charge.ok).toBe(true);
    const moves = await t.db.movement.count();
    const cyclic = await attempt({
      at: at("2026-01-03T09:00:00Z"),
      role: "TRANSFER",
      fromHolderId: ids.product,
      toHolderId: ids.lot,
      massG: 500,
    });
    expect(cyclic.ok).toBe(false);
    if (!cyclic.ok) {
      expect(cyclic.issues[0]).toMatchObject({ code: "LEDGER.CYCLE", field: "massKg" });
      expect(cyclic.issues[0]?.message).toMatch(/its own ancestor/);
    }
    expect(await t.db.movement.count()).toBe(moves);
    expect(moves).toBe(before + 2);
    const stock = await t.db.holder.findUniqueOrThrow({ where: { id: ids.product }, select: { stockG: true } });
    expect(stock.stockG).toBe(49_000); // the refused draw left P's stock as it was
  });

  it("lets material pass through a tank in both directions (tanks are reusable vessels)", async () => {
    const intoTank = await attempt({
      at: at("2026-01-05T08:00:00Z"),
      role: "TRANSFER",
      fromHolderId: ids.lot,
      toHolderId: ids.tank,
      massG: 10_000,
    });
    expect(intoTank.ok).toBe(true);
    const back = await attempt({
      at: at("2026-01-06T08:00:00Z"),
      role: "TRANSFER",
      fromHolderId: ids.tank,
      toHolderId: ids.lot,
      massG: 5_000,
    });
    expect(back.ok).toBe(true);
  });
});
