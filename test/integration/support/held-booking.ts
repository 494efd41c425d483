import pg from "pg";
import type { TestDb } from "./test-db";

/**
 * A receipt of `massG` dated `at` (PostgreSQL timestamp text) inserted in a transaction of its own and
 * held open, as a booking still in flight: PostgreSQL has handed it its id, nothing else sees it until
 * commit(). Shaped like the site's latest receipt.
 */
export async function holdReceipt(
  t: TestDb,
  siteId: number,
  at: string,
  massG: number,
): Promise<{ id: number; commit(): Promise<void> }> {
  const like = await t.db.movement.findFirstOrThrow({
    where: { siteId, fromHolderId: null, role: "RECEIPT" },
    orderBy: { id: "desc" },
  });
  const c = new pg.Client({ connectionString: t.url });
  await c.connect();
  await c.query("BEGIN");
  const r = await c.query<{ id: number }>(
    `INSERT INTO "Movement" ("siteId", at, role, "fromHolderId", "toHolderId", "massG", note, "recordedById") VALUES ($1, $2::timestamp, 'RECEIPT', NULL, $3, $4, 'held booking', $5) RETURNING id`,
    [siteId, at, like.toHolderId, massG, like.recordedById],
  );
  return {
    id: Number(r.rows[0]?.id),
    commit: async () => {
      await c.query("COMMIT");
      await c.end();
    },
  };
}
