// Planner statistics after bulk writes: a 50,000-row import changes the tables' shape more than the
// statistics gathered at connection open say.
import type { Db } from "@/lib/core/connect";
import { dialectOf } from "@/lib/core/bulk-insert";

/** Rows written at once beyond which an import refreshes the planner statistics. */
export const REFRESH_STATS_AFTER_ROWS = 1_000;

/** SQLite: `PRAGMA optimize` (re-analyses only what changed enough). PostgreSQL: ANALYZE of the ledger's bulk tables. */
export async function refreshPlannerStats(db: Db): Promise<void> {
  if (dialectOf(db) === "sqlite") await db.$executeRawUnsafe("PRAGMA optimize");
  else await db.$executeRawUnsafe('ANALYZE "Holder", "Pickup", "Movement", "AuditEvent"');
}
