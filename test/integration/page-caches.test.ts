// The home page's read model and the lots page's reads kept by ledger position (app/_today/today-kept.ts,
// app/lots/lots-kept.ts): the same question at the same position is answered from memory with what a
// fresh read gives; a booking makes the next ask read again and the new answer shows it; the home page
// also reads again in a new quarter-hour, the receipts picture in a new week.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import { transferToTank } from "@/lib/tank/tank.service";
import { listLots } from "@/lib/feedstock/lot.store";
import { getDashboard } from "@/app/_today/today";
import { clearTodayCache, keptToday } from "@/app/_today/today-kept";
import { clearLotsCaches, keptLotPage, keptReceiptsDrawing } from "@/app/lots/lots-kept";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

describe.each(PROVIDERS)("home page and lots page reads kept by ledger position on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  const now = new Date("2026-03-01T12:00:00Z");
  const site = () => ({ id: plant.siteId, timeZone: "UTC" });
  const query = { skip: 0, take: 100 };

  beforeAll(async () => {
    clearTodayCache();
    clearLotsCaches();
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    await acceptedLot(t.db, plant, { lot: "L-1", pickup: "PU-1", day: 2 });
  }, 120_000);
  afterAll(async () => {
    clearTodayCache();
    clearLotsCaches();
    await t.drop();
  });

  it("answers the same question at the same position from memory, equal to a fresh read", async () => {
    const today = await keptToday(t.db, site(), now);
    const todayAgain = await keptToday(t.db, site(), new Date(now.getTime() + 60_000));
    expect([today.outcome, todayAgain.outcome]).toEqual(["computed", "same-position"]);
    expect(todayAgain.value).toBe(today.value);
    expect(todayAgain.value.dashboard).toEqual(await getDashboard(t.db, site(), now));

    const lots = await keptLotPage(t.db, plant.siteId, query);
    const lotsAgain = await keptLotPage(t.db, plant.siteId, query);
    expect([lots.outcome, lotsAgain.outcome]).toEqual(["computed", "same-position"]);
    expect(lotsAgain.value).toEqual(await listLots(t.db, plant.siteId, query));
    // Another page of the list, or another status, is another question.
    expect((await keptLotPage(t.db, plant.siteId, { ...query, status: "QUARANTINED" })).outcome).toBe("computed");

    const picture = await keptReceiptsDrawing(t.db, plant.siteId, "UTC", now);
    const pictureAgain = await keptReceiptsDrawing(t.db, plant.siteId, "UTC", new Date(now.getTime() + 3_600_000));
    expect([picture.outcome, pictureAgain.outcome]).toEqual(["computed", "same-position"]);
    expect(pictureAgain.value.drawn?.svg).toContain("<svg");
    expect(picture.value.series.totalG).toBeGreaterThan(0);
  });

  it("a booking makes each read again, and the new answers show it", async () => {
    const before = await keptToday(t.db, site(), now);
    const lotBefore = (await keptLotPage(t.db, plant.siteId, query)).value.rows.find((l) => l.code === "L-1");
    const receiptsBefore = (await keptReceiptsDrawing(t.db, plant.siteId, "UTC", now)).value;
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-03T08:00:00Z",
        massKg: 100,
      }),
    );
    const after = await keptToday(t.db, site(), now);
    expect(after.outcome).toBe("computed");
    const t1Before = before.value.dashboard.tanks.find((x) => x.code === "T1")?.stockG ?? 0;
    expect(after.value.dashboard.tanks.find((x) => x.code === "T1")?.stockG).toBe(t1Before + 100_000);
    const lotsAfter = await keptLotPage(t.db, plant.siteId, query);
    expect(lotsAfter.outcome).toBe("computed");
    expect(lotsAfter.value.rows.find((l) => l.code === "L-1")?.stockG).toBe((lotBefore?.stockG ?? 0) - 100_000);

    // A second lot received: a receipt the picture must count.
    await acceptedLot(t.db, plant, { lot: "L-2", pickup: "PU-2", day: 9 });
    const receiptsAfter = await keptReceiptsDrawing(t.db, plant.siteId, "UTC", now);
    expect(receiptsAfter.outcome).toBe("computed");
    expect(receiptsAfter.value.series.totalG).toBeGreaterThan(receiptsBefore.series.totalG);
    expect(receiptsAfter.value.drawn?.summary).not.toBe(receiptsBefore.drawn?.summary);
    expect((await keptToday(t.db, site(), now)).value.dashboard.counts.lots).toBe(2);
  });

  it("a new quarter-hour reads the home page again, a new week the receipts picture", async () => {
    await keptToday(t.db, site(), now);
    expect((await keptToday(t.db, site(), new Date(now.getTime() + 15 * 60_000))).outcome).toBe("computed");
    await keptReceiptsDrawing(t.db, plant.siteId, "UTC", now);
    const nextWeek = new Date(now.getTime() + 7 * 86_400_000);
    expect((await keptReceiptsDrawing(t.db, plant.siteId, "UTC", nextWeek)).outcome).toBe("computed");
    // The same instant in another time zone is another week's picture.
    expect((await keptReceiptsDrawing(t.db, plant.siteId, "Pacific/Auckland", now)).outcome).toBe("computed");
  });
});
