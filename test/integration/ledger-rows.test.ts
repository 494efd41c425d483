// The ledger read as one aggregated text value (lib/ledger/ledger-rows.store.ts) gives exactly what
// Prisma's row-by-row read gives: every id, instant to the millisecond, nulls, and holder codes with
// the separators in them; and only the site asked for.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import { insertSite, insertUser } from "@/lib/site/site.store";
import { readHolderRows, readMoveRows } from "@/lib/ledger/ledger-rows.store";

describe.each(PROVIDERS)("the aggregated ledger read on %s", (provider) => {
  let t: TestDb;
  let siteId: number;
  let otherSiteId: number;

  beforeAll(async () => {
    t = await createTestDb(provider);
    const site = await insertSite(t.db, { code: "RWS", name: "Rows Works", town: "Rowford", timeZone: "UTC" });
    const other = await insertSite(t.db, { code: "OTH", name: "Other Works", town: "Otherford", timeZone: "UTC" });
    siteId = site.id;
    otherSiteId = other.id;
    const user = await insertUser(t.db, { siteId, login: "rows", fullName: "Rows", role: "ADMIN" });
    const otherUser = await insertUser(t.db, { siteId: otherSiteId, login: "oth", fullName: "Oth", role: "ADMIN" });
    const codes = ["T1", "LOT;7", "A,B", "back\\slash", "semi\\s;"];
    const holders = [];
    for (const code of codes) holders.push(await t.db.holder.create({ data: { siteId, kind: "LOT", code } }));
    const foreign = await t.db.holder.create({ data: { siteId: otherSiteId, kind: "LOT", code: "T1" } });
    const times = ["2026-01-01T00:00:00.000Z", "2026-03-29T01:59:59.999Z", "2026-07-15T12:34:56.789Z"];
    let previous: number | null = null;
    for (const [i, iso] of times.entries()) {
      const from = i === 0 ? null : (holders[i - 1]?.id ?? null);
      const to = holders[i]?.id ?? 0;
      const m = await t.db.movement.create({
        data: {
          siteId,
          at: new Date(iso),
          role: i === 0 ? "RECEIPT" : "TRANSFER",
          fromHolderId: from,
          toHolderId: to,
          massG: 1000 + i,
          recordedById: user.id,
        },
      });
      previous = m.id;
    }
    await t.db.movement.create({
      data: {
        siteId,
        at: new Date(times[2] ?? ""),
        role: "TRANSFER",
        fromHolderId: holders[2]?.id ?? 0,
        toHolderId: holders[1]?.id ?? 0,
        massG: 1002,
        recordedById: user.id,
        reversesId: previous,
      },
    });
    await t.db.movement.create({
      data: {
        siteId: otherSiteId,
        at: new Date(),
        role: "RECEIPT",
        toHolderId: foreign.id,
        massG: 5,
        recordedById: otherUser.id,
      },
    });
  }, 120_000);
  afterAll(async () => t.drop());

  it("reads every movement and holder of the site exactly as Prisma does, and none of another site", async () => {
    const expectedMoves = (
      await t.db.movement.findMany({
        where: { siteId },
        select: { id: true, at: true, fromHolderId: true, toHolderId: true, massG: true, reversesId: true },
      })
    ).map((m) => ({ ...m, at: m.at.getTime() }));
    const moves = (await readMoveRows(t.db, siteId)).sort((a, b) => a.id - b.id);
    expect(moves).toEqual(expectedMoves.sort((a, b) => a.id - b.id));
    expect(moves).toHaveLength(4);
    const expectedHolders = await t.db.holder.findMany({
      where: { siteId },
      select: { id: true, kind: true, code: true },
    });
    const holders = (await readHolderRows(t.db, siteId)).sort((a, b) => a.id - b.id);
    expect(holders).toEqual(expectedHolders.sort((a, b) => a.id - b.id));
    expect(holders.map((h) => h.code)).toContain("semi\\s;");
  });

  it("reads only the rows after an id, and nothing for a site without rows", async () => {
    const all = (await readMoveRows(t.db, siteId)).map((m) => m.id).sort((a, b) => a - b);
    const after = (await readMoveRows(t.db, siteId, all[1])).map((m) => m.id).sort((a, b) => a - b);
    expect(after).toEqual(all.slice(2));
    expect(await readMoveRows(t.db, siteId + 1000)).toEqual([]);
    expect(await readHolderRows(t.db, siteId + 1000)).toEqual([]);
  });
});
