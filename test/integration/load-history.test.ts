// npm run load -- --years: the synthetic ledger written into a fresh database with what the run needs to
// sign in and ask real questions, and the mix leaving out (and naming) what the ledger cannot answer.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDb } from "@/lib/core/connect";
import type { Db } from "@/lib/core/connect";
import { verifyPassword } from "@/lib/auth/password";
import { requireTankRoom } from "@/lib/tank/tank.store";
import { PLANT_TANKS } from "@/bench/plant-history";
import {
  createHistoryDatabase,
  historyCodes,
  historyHeader,
  historyOf,
  historyReadMix,
  lastMonthOf,
} from "@/bench/load-history";
import type { LoadDatabase } from "@/bench/load-server";
import { DEMO_PASSWORD, READER_LOGIN, readMix, WRITER_LOGIN, writeMix } from "@/bench/load-mix";

const history = historyOf(1);
let database: LoadDatabase;
let db: Db;

beforeAll(async () => {
  database = (await createHistoryDatabase("sqlite", `test-history-${process.pid}`, history)).database;
  db = await openDb(database.url);
});

afterAll(async () => {
  await db.$disconnect();
  await database.drop();
});

describe("load run on a synthetic history", () => {
  it("refuses a history length that is not a whole number of years ≥ 1", () => {
    expect(() => historyOf(0)).toThrow(/--years/);
    expect(() => historyOf(1.5)).toThrow(/--years/);
  });

  it("holds the whole ledger and the reader and writer with the demo password", async () => {
    expect(await db.movement.count()).toBe(history.moves.length);
    for (const [login, role] of [
      [READER_LOGIN, "COMPLIANCE"],
      [WRITER_LOGIN, "PRODUCTION"],
    ] as const) {
      const u = await db.user.findUniqueOrThrow({ where: { login } });
      expect(u.role).toBe(role);
      expect(await verifyPassword(u.passwordHash ?? "", DEMO_PASSWORD)).toBe(true);
    }
  });

  it("records the generator's tanks on their own holders, holding the generator's capacity", async () => {
    const tanks = await db.tank.findMany({ include: { holder: true }, orderBy: { code: "asc" } });
    expect(tanks.map((t) => t.code).sort()).toEqual(PLANT_TANKS.map((t) => t.code).sort());
    for (const def of PLANT_TANKS) {
      const t = tanks.find((x) => x.code === def.code);
      expect(t?.holder.kind).toBe("TANK");
      expect(t?.service).toBe(def.service);
      const room = await db.$transaction((tx) => requireTankRoom(tx, t?.holderId ?? 0, 0, "massKg"));
      expect(room?.capacityG).toBeGreaterThanOrEqual(def.capacityT * 1_000_000);
      expect(room?.capacityG).toBeLessThan(def.capacityT * 1_000_000 + 1_000);
    }
    expect((await db.source.findMany()).map((s) => s.code)).toEqual([historyCodes(history).source]);
  });

  it("asks about the last shipment and the early certified lot, and draws from stocked feedstock tanks", async () => {
    const codes = historyCodes(history);
    const shipments = await db.holder.findMany({ where: { kind: "SHIPMENT" }, orderBy: { id: "desc" }, take: 1 });
    expect(codes.shipment).toBe(shipments[0]?.code);
    const lot = await db.holder.findUniqueOrThrow({ where: { id: history.probes.earlyLotHolderId } });
    expect([lot.kind, lot.code]).toEqual(["LOT", codes.lot]);
    expect(codes.stocked.length).toBeGreaterThan(0);
    for (const s of codes.stocked) {
      const h = await db.holder.findFirstOrThrow({ where: { kind: "TANK", code: s.code }, include: { tank: true } });
      expect(h.tank?.service).toBe("FEEDSTOCK");
      expect(h.stockG).toBeGreaterThanOrEqual(1_000_000);
    }
  });

  it("leaves the lots list, waste due and pickup rows out of both mixes, says so, and asks the history's last month", () => {
    const codes = { ...historyCodes(history), transfers: [] };
    const reads = historyReadMix(codes, history);
    const left = readMix(codes)
      .map((m) => m.route)
      .filter((r) => !reads.some((m) => m.route === r) && !r.startsWith("json balance"));
    expect(left.sort()).toEqual(["json grid rows (pickups)", "page /lots", "page /waste/due"]);
    const header = historyHeader(history).join("\n");
    for (const route of left) expect(header).toContain(`left out of the mixes: ${route}`);
    expect(lastMonthOf(history)).toEqual({ year: 2026, month: 9 });
    expect(reads.find((m) => m.route.startsWith("json balance"))?.path).toBe(
      "/api/balance?period=MONTH&year=2026&month=9",
    );
    const writes = writeMix(codes, reads);
    expect(writes.filter((m) => m.kind !== "write").every((m) => reads.some((r) => r.route === m.route))).toBe(true);
    expect(writes.filter((m) => m.kind === "write")).toHaveLength(2);
  });
});
