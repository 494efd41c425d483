// The synthetic plant in PostgreSQL: a database of the benchmark's own (created, migrated with the real
// migrations, dropped afterwards), one or more sites written with array inserts, and a site's history
// moved to other ids so several sites share one database.
import pg from "pg";
import { deploy } from "@/prisma/migrate";
import type { PlantHistory } from "@/bench/plant-history";

/** The server the benchmark creates its databases on (trust auth); BENCH_PG_URL overrides it. */
export const BENCH_PG_URL = process.env.BENCH_PG_URL ?? "postgresql://postgres@127.0.0.1:5432/test";

export interface BenchPgDatabase {
  url: string;
  migrateMs: number;
  drop(): Promise<void>;
}

function withDatabase(url: string, database: string): string {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}

async function admin(sql: string): Promise<void> {
  const c = new pg.Client({ connectionString: BENCH_PG_URL });
  await c.connect();
  try {
    await c.query(sql);
  } finally {
    await c.end();
  }
}

/** A fresh, migrated database named tracevat_bench_<tag>, dropped by drop(). */
export async function createBenchPgDatabase(tag: string): Promise<BenchPgDatabase> {
  const name = `tracevat_bench_${tag}`;
  await admin(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  await admin(`CREATE DATABASE "${name}"`);
  const url = withDatabase(BENCH_PG_URL, name);
  const t0 = performance.now();
  await deploy(url);
  return {
    url,
    migrateMs: performance.now() - t0,
    drop: () => admin(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`),
  };
}

/** The history with every holder id raised by `holderOffset` and every move id by `moveOffset`, as site `siteId`. */
export function shiftHistory(h: PlantHistory, siteId: number, holderOffset: number, moveOffset: number): PlantHistory {
  const hid = (id: number) => id + holderOffset;
  return {
    ...h,
    siteId,
    holders: h.holders.map((x) => ({ ...x, id: hid(x.id), siteId })),
    moves: h.moves.map((m) => ({
      ...m,
      id: m.id + moveOffset,
      fromHolderId: m.fromHolderId === null ? null : hid(m.fromHolderId),
      toHolderId: hid(m.toHolderId),
    })),
    finalStockG: new Map([...h.finalStockG].map(([id, g]) => [hid(id), g])),
    probes: {
      ...h.probes,
      lateProductLotHolderId: hid(h.probes.lateProductLotHolderId),
      earlyLotHolderId: hid(h.probes.earlyLotHolderId),
      // Origins are the entry moves that brought the material in.
      earlyLotOriginIds: h.probes.earlyLotOriginIds.map((id) => id + moveOffset),
      lastShipmentMoveId: h.probes.lastShipmentMoveId + moveOffset,
    },
    custody: { ...h.custody, siteId },
  };
}

const CHUNK = 20_000;

/**
 * Writes one site (its Site row, one user, every holder and movement) into a migrated database, in one
 * transaction; returns the milliseconds taken. Ids are written as given, and the sequences are moved
 * past them so the app can book after them.
 */
export async function writeHistoryPostgres(url: string, h: PlantHistory, userId: number): Promise<number> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  const t0 = performance.now();
  try {
    await c.query("BEGIN");
    await c.query('INSERT INTO "Site" (id, code, name, town, "timeZone") VALUES ($1, $2, $3, $4, $5)', [
      h.siteId,
      `BENCH-${h.siteId}`,
      `Benchmark plant ${h.siteId} (synthetic)`,
      "Nowhere",
      "UTC",
    ]);
    await c.query('INSERT INTO "User" (id, "siteId", login, "fullName", role) VALUES ($1, $2, $3, $4, $5)', [
      userId,
      h.siteId,
      `bench.${h.siteId}`,
      "Benchmark loader",
      "ADMIN",
    ]);
    for (let i = 0; i < h.holders.length; i += CHUNK) {
      const part = h.holders.slice(i, i + CHUNK);
      await c.query(
        'INSERT INTO "Holder" (id, "siteId", kind, code, "stockG") SELECT * FROM unnest($1::int[], $2::int[], $3::text[], $4::text[], $5::int[])',
        [
          part.map((x) => x.id),
          part.map(() => h.siteId),
          part.map((x) => x.kind),
          part.map((x) => x.code),
          part.map((x) => h.finalStockG.get(x.id) ?? 0),
        ],
      );
    }
    for (let i = 0; i < h.moves.length; i += CHUNK) {
      const part = h.moves.slice(i, i + CHUNK);
      await c.query(
        'INSERT INTO "Movement" (id, "siteId", at, role, "fromHolderId", "toHolderId", "massG", "recordedById") ' +
          "SELECT * FROM unnest($1::int[], $2::int[], $3::timestamp(3)[], $4::text[], $5::int[], $6::int[], $7::int[], $8::int[])",
        [
          part.map((m) => m.id),
          part.map(() => h.siteId),
          part.map((m) => new Date(m.at).toISOString().replace("Z", "")),
          part.map((m) => m.role),
          part.map((m) => m.fromHolderId),
          part.map((m) => m.toHolderId),
          part.map((m) => m.massG),
          part.map(() => userId),
        ],
      );
    }
    for (const table of ["Site", "User", "Holder", "Movement"])
      await c.query(`SELECT setval(pg_get_serial_sequence('"${table}"', 'id'), (SELECT MAX(id) FROM "${table}"))`);
    await c.query("COMMIT");
    await c.query("ANALYZE");
  } catch (err) {
    await c.query("ROLLBACK").catch(() => undefined);
    throw err;
  } finally {
    await c.end();
  }
  return performance.now() - t0;
}

/** The floor query on PostgreSQL: the same columns and order as FLOOR_SQL on SQLite. */
export async function openPgFloorReader(
  url: string,
  siteId: number,
): Promise<{ read(): Promise<number>; close(): Promise<void> }> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  const sql =
    'SELECT id, at, "fromHolderId", "toHolderId", "massG" FROM "Movement" WHERE "siteId" = $1 ORDER BY at, id';
  return {
    read: async () => (await c.query({ text: sql, values: [siteId], name: "floor" })).rowCount ?? 0,
    close: () => c.end(),
  };
}
