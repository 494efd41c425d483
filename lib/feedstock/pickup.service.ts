import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import { z } from "zod";
import type { Db, Tx } from "@/lib/database/connect";
import type { DomainIssue, Result } from "@/lib/errors";
import { fail, failMany, ok } from "@/lib/errors";
import { parseInput } from "@/lib/ledger/parse";
import { createHolder, postMovement, runInTransaction } from "@/lib/ledger/ledger.store";
import { measureObserved } from "@/lib/feedstock/measure";
import { PickupSchema } from "@/lib/feedstock/pickup.schema";
import type { Pickup } from "@/lib/feedstock/pickup.schema";
import { toMillilitres } from "@/lib/quantity/units";
import { findPickupByKey, insertPickup } from "@/lib/feedstock/pickup.store";
import { requireSourceId } from "@/lib/source/source.store";
import type { DensityTable } from "@/lib/quantity/density";
import { DEFAULT_DENSITY_TABLE } from "@/lib/quantity/density";
import type { Actor } from "@/lib/site/actor";

export interface PickupSaved {
  id: number;
  code: string;
  massG: number;
  receivedAt: Date;
}

function measurePickup(p: Pickup, table: DensityTable): Result<number> {
  const measured = measureObserved({ material: p.material, observedVolumeL: p.volumeL, observedTempC: p.tempC, referenceTempC: 15, table });
  return measured.ok ? ok(measured.value.massG) : fail("PICKUP.UNMEASURABLE", measured.issues.map((i) => i.message).join("; "), "volumeL");
}

async function writePickup(tx: Tx, actor: Actor, p: Pickup, massG: number, field = (f: string) => f): Promise<PickupSaved> {
  const sourceId = await requireSourceId(tx, actor.siteId, p.sourceCode, field("sourceCode"));
  const holderId = await createHolder(tx, actor.siteId, "PICKUP", p.code, field("code"));
  const saved = await insertPickup(tx, { siteId: actor.siteId, holderId, sourceId, collectorId: actor.userId, receivedAt: actor.now, massG, pickup: p });
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
export async function recordPickup(db: Db, actor: Actor, input: unknown, table: DensityTable = DEFAULT_DENSITY_TABLE): Promise<Result<PickupSaved>> {
  const parsed = parseInput(PickupSchema, input);
  if (!parsed.ok) return parsed;
  const p = parsed.value;
  if (p.idempotencyKey) {
    const earlier = await findPickupByKey(db, p.idempotencyKey);
    if (earlier) return ok(earlier);
  }
  const massG = measurePickup(p, table);
  if (!massG.ok) return massG;
  return runInTransaction(db, (tx) => writePickup(tx, actor, p, massG.value));
}

export const MAX_IMPORT_ROWS = 5_000;
export const PickupImportSchema = z.object({
  rows: z.array(z.unknown()).min(1, "rows: the import is empty").max(MAX_IMPORT_ROWS, `rows: at most ${MAX_IMPORT_ROWS.toLocaleString("en")} rows per import`),
});

/**
 * Imports many pickups all-or-nothing: every row is parsed first and all problems are reported by
 * row and field; then one transaction writes them all. Rows whose idempotency key is already stored
 * are skipped, so a re-sent or resumed import never duplicates.
 */
export async function importPickups(db: Db, actor: Actor, input: unknown, table: DensityTable = DEFAULT_DENSITY_TABLE): Promise<Result<{ written: number; skipped: number }>> {
  const parsed = parseInput(PickupImportSchema, input);
  if (!parsed.ok) return parsed;
  const rows: Array<{ p: Pickup; massG: number; i: number }> = [];
  const issues: DomainIssue[] = [];
  parsed.value.rows.forEach((raw, i) => {
    const r = parseInput(PickupSchema, raw);
    if (!r.ok) return issues.push(...r.issues.map((x) => ({ ...x, field: `rows.${i}.${x.field ?? ""}`, message: `Row ${i + 1}: ${x.message}` })));
    const m = measurePickup(r.value, table);
    if (!m.ok) return issues.push(...m.issues.map((x) => ({ ...x, field: `rows.${i}.volumeL`, message: `Row ${i + 1}: ${x.message}` })));
    rows.push({ p: r.value, massG: m.value, i });
  });
  if (issues.length) return failMany(issues);
  return runInTransaction(
    db,
    async (tx) => {
      let written = 0;
      let skipped = 0;
      for (const { p, massG, i } of rows) {
        if (p.idempotencyKey && (await findPickupByKey(tx, p.idempotencyKey))) {
          skipped++;
          continue;
        }
        await writePickup(tx, actor, p, massG, (f) => `rows.${i}.${f}`);
        written++;
      }
      return { written, skipped };
    },
    120_000,
  );
}
