import "server-only";
import { appendAudit, appendAuditMany } from "@/lib/audit/audit.store";
import { z } from "zod";
import type { Db, Tx } from "@/lib/core/connect";
import { refreshPlannerStats, REFRESH_STATS_AFTER_ROWS } from "@/lib/database/maintenance";
import type { DomainIssue, Result } from "@/lib/core/result";
import { fail, failMany, ok } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { createHolder, createHoldersWithStock, postMovement, postReceipts } from "@/lib/ledger/ledger.store";
import { idempotencyKeyInForce, runInTransaction } from "@/lib/ledger/transaction.store";
import { log } from "@/lib/log/log.service";
import { measureObserved } from "@/lib/feedstock/measure";
import { PickupSchema } from "@/lib/feedstock/pickup.schema";
import type { Pickup } from "@/lib/feedstock/pickup.schema";
import { toMillilitres } from "@/lib/quantity/units";
import { findPickupByKey, findPickupKeys, insertPickup, insertPickups } from "@/lib/feedstock/pickup.store";
import type { PickupSaved } from "@/lib/feedstock/pickup.store";
import { requireSourceId, requireSourceIds } from "@/lib/source/source.store";
import type { DensityTable } from "@/lib/quantity/density";
import { DEFAULT_DENSITY_TABLE } from "@/lib/quantity/density";
import type { Actor } from "@/lib/core/actor";

export type { PickupSaved } from "@/lib/feedstock/pickup.store";

function measurePickup(p: Pickup, table: DensityTable): Result<number> {
  const measured = measureObserved({
    material: p.material,
    observedVolumeL: p.volumeL,
    observedTempC: p.tempC,
    referenceTempC: 15,
    table,
  });
  return measured.ok
    ? ok(measured.value.massG)
    : fail("PICKUP.UNMEASURABLE", measured.issues.map((i) => i.message).join("; "), "volumeL");
}

async function writePickup(
  tx: Tx,
  actor: Actor,
  p: Pickup,
  massG: number,
  field = (f: string) => f,
): Promise<PickupSaved> {
  const sourceId = await requireSourceId(tx, actor.siteId, p.sourceCode, field("sourceCode"));
  const holderId = await createHolder(tx, actor.siteId, "PICKUP", p.code, field("code"));
  const saved = await insertPickup(tx, {
    siteId: actor.siteId,
    holderId,
    sourceId,
    collectorId: actor.userId,
    receivedAt: actor.now,
    massG,
    pickup: p,
  });
  await postMovement(tx, {
    siteId: actor.siteId,
    at: p.observedAt,
    role: "RECEIPT",
    fromHolderId: null,
    toHolderId: holderId,
    massG,
    volumeMl: toMillilitres(p.volumeL),
    tempC: p.tempC,
    recordedById: actor.userId,
    field: field("volumeL"),
  });
  await appendAudit(tx, actor, { action: "CREATE", entity: "Pickup", entityKey: p.code, after: { ...p, massG } });
  return saved;
}

/**
 * Records a pickup as observed at the source: its oil enters the books here (a RECEIPT movement
 * into the pickup). A retried submission with the same idempotency key gets the first answer back.
 */
export async function recordPickup(
  db: Db,
  actor: Actor,
  input: unknown,
  table: DensityTable = DEFAULT_DENSITY_TABLE,
): Promise<Result<PickupSaved>> {
  const parsed = parseInput(PickupSchema, input);
  if (!parsed.ok) return parsed;
  const p = parsed.value;
  if (p.idempotencyKey) {
    const earlier = await findPickupByKey(db, p.idempotencyKey);
    // The same key for a different pickup is a client error, not a retry: say so instead of answering with another record.
    if (earlier && earlier.code !== p.code)
      return fail(
        "IDEMPOTENCY.KEY_REUSED",
        `This key was already used for pickup ${earlier.code}; a new pickup needs a new key`,
        "idempotencyKey",
      );
    if (earlier) return ok(earlier);
  }
  const massG = measurePickup(p, table);
  if (!massG.ok) return massG;
  return runInTransaction(db, (tx) => writePickup(tx, actor, p, massG.value));
}

export const MAX_IMPORT_ROWS = 5_000;
export const PickupImportSchema = z.object({
  rows: z
    .array(z.unknown())
    .min(1, "rows: the import is empty")
    .max(MAX_IMPORT_ROWS, `rows: at most ${MAX_IMPORT_ROWS.toLocaleString("en")} rows per import`),
});

/**
 * Many pickups in one transaction with a handful of statements per 500 rows: the same records, ledger
 * receipts and audit events (in row order) as writePickup once per row, for imports of tens of thousands.
 */
async function writePickups(
  tx: Tx,
  actor: Actor,
  rows: ReadonlyArray<{ p: Pickup; massG: number; field: (f: string) => string }>,
): Promise<void> {
  if (rows.length === 0) return;
  const sources = await requireSourceIds(
    tx,
    actor.siteId,
    rows.map((r) => ({ code: r.p.sourceCode, field: r.field("sourceCode") })),
  );
  const holders = await createHoldersWithStock(
    tx,
    actor.siteId,
    "PICKUP",
    rows.map((r) => ({ code: r.p.code, stockG: r.massG, field: r.field("code") })),
  );
  const holderOf = (code: string) => holders.get(code) ?? 0;
  await insertPickups(
    tx,
    rows.map((r) => ({
      siteId: actor.siteId,
      holderId: holderOf(r.p.code),
      sourceId: sources.get(r.p.sourceCode) ?? 0,
      collectorId: actor.userId,
      receivedAt: actor.now,
      massG: r.massG,
      pickup: r.p,
    })),
  );
  await postReceipts(
    tx,
    rows.map((r) => ({
      siteId: actor.siteId,
      at: r.p.observedAt,
      role: "RECEIPT" as const,
      fromHolderId: null,
      toHolderId: holderOf(r.p.code),
      massG: r.massG,
      volumeMl: toMillilitres(r.p.volumeL),
      tempC: r.p.tempC,
      recordedById: actor.userId,
      field: r.field("observedAt"),
    })),
  );
  await appendAuditMany(
    tx,
    actor,
    rows.map((r) => ({
      action: "CREATE" as const,
      entity: "Pickup",
      entityKey: r.p.code,
      after: { ...r.p, massG: r.massG },
    })),
  );
}

/**
 * Pickup rows all-or-nothing, without a row limit (the caller sets one): every row is parsed first and
 * all problems are reported by row and field ("rows.<i>.<field>"); then one transaction writes them
 * all. Rows whose idempotency key is already stored, or repeated in the file, are skipped, so a re-sent
 * or resumed import never duplicates.
 */
export async function importPickupRows(
  db: Db,
  actor: Actor,
  raw: readonly unknown[],
  table: DensityTable = DEFAULT_DENSITY_TABLE,
): Promise<Result<{ written: number; skipped: number }>> {
  const rows: Array<{ p: Pickup; massG: number; field: (f: string) => string }> = [];
  const issues: DomainIssue[] = [];
  raw.forEach((input, i) => {
    const r = parseInput(PickupSchema, input);
    if (!r.ok)
      return issues.push(
        ...r.issues.map((x) => ({ ...x, field: `rows.${i}.${x.field ?? ""}`, message: `Row ${i + 1}: ${x.message}` })),
      );
    const m = measurePickup(r.value, table);
    if (!m.ok)
      return issues.push(
        ...m.issues.map((x) => ({ ...x, field: `rows.${i}.volumeL`, message: `Row ${i + 1}: ${x.message}` })),
      );
    rows.push({ p: r.value, massG: m.value, field: (f) => `rows.${i}.${f}` });
  });
  if (issues.length) return failMany(issues);
  return runInTransaction(
    db,
    async (tx) => {
      // Operators (and the kill -9 test) can see an import's transaction is open and not yet committed.
      log.info({ event: "import.transaction.open", key: idempotencyKeyInForce() ?? null, rows: rows.length });
      const stored = await findPickupKeys(
        tx,
        rows.flatMap((r) => (r.p.idempotencyKey ? [r.p.idempotencyKey] : [])),
      );
      const fresh = rows.filter((r) => {
        const key = r.p.idempotencyKey;
        if (!key) return true;
        if (stored.has(key)) return false;
        stored.add(key);
        return true;
      });
      await writePickups(tx, actor, fresh);
      return { written: fresh.length, skipped: rows.length - fresh.length };
    },
    600_000,
  );
}

/** The JSON import (POST /api/pickups/import): at most MAX_IMPORT_ROWS rows per call. */
export async function importPickups(
  db: Db,
  actor: Actor,
  input: unknown,
  table: DensityTable = DEFAULT_DENSITY_TABLE,
): Promise<Result<{ written: number; skipped: number }>> {
  const parsed = parseInput(PickupImportSchema, input);
  if (!parsed.ok) return parsed;
  const written = await importPickupRows(db, actor, parsed.value.rows, table);
  if (written.ok && written.value.written >= REFRESH_STATS_AFTER_ROWS) await refreshPlannerStats(db);
  return written;
}
