// Loads the demo plant into an empty database (run at start; `--reset` replaces an existing demo).
//   node --conditions=react-server --import tsx seeds/load.ts [--reset]
// Every operation is first parsed with the same schema the app and API use; any bad record is
// reported with its row and field before anything is written. On SQLite the demo is built in a
// side file and moved into place only when complete, so a failed load leaves nothing half-written.
import { existsSync, renameSync, rmSync } from "node:fs";
import path from "node:path";
import type { z } from "zod";
import type { Db } from "@/lib/core/connect";
import { DEFAULT_DATABASE_URL, isPostgresUrl, openDb, sqliteFilePath } from "@/lib/core/connect";
import type { DomainIssue, Result } from "@/lib/core/result";
import { deploy } from "@/prisma/migrate";
import { buildScenario } from "@/seeds/scenario";
import type { Op } from "@/seeds/scenario";
import { DEMO_PASSWORD, PEOPLE, SITE } from "@/seeds/names";
import { hashPassword } from "@/lib/auth/password";
import { insertSite, insertUser, countSites } from "@/lib/site/site.store";
import type { Actor } from "@/lib/core/actor";
import { SourceSchema } from "@/lib/source/source.schema";
import { createSource } from "@/lib/source/source.service";
import { SourceProfileSchema } from "@/lib/screening/screening.schema";
import { saveSourceProfile } from "@/lib/screening/decision.service";
import { runScreen } from "@/lib/screening/screening.service";
import { parseInput } from "@/lib/ledger/parse";
import { PickupSchema } from "@/lib/feedstock/pickup.schema";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { DeliveryLotSchema, LabTestSchema, LotDecisionSchema, LotFromPickupsSchema } from "@/lib/feedstock/lot.schema";
import { decideLot, receiveDelivery, receiveLotFromPickups, recordLabTest } from "@/lib/feedstock/lot.service";
import { LotTitrationSchema, recordTitration } from "@/lib/feedstock/titration.service";
import { GaugeSchema, TankSchema, TransferSchema } from "@/lib/tank/tank.schema";
import { createTank, recordGauge, transferToTank } from "@/lib/tank/tank.service";
import { BatchCompleteSchema, BatchPlanSchema, BatchStartSchema, ReagentLotSchema } from "@/lib/batch/batch.schema";
import { completeBatch, planBatch, receiveReagent, startBatch } from "@/lib/batch/batch.service";
import { ProductDecisionSchema, QcResultSchema } from "@/lib/product/product.schema";
import { decideProductLot, recordQcResult } from "@/lib/product/product.service";
import { ShipmentRecordSchema } from "@/lib/shipment/shipment.schema";
import { recordShipment } from "@/lib/shipment/shipment.service";
import { CustomerSchema } from "@/lib/customer/customer.schema";
import { createCustomer } from "@/lib/customer/customer.service";
import { DisposalSchema, WasteContainerSchema } from "@/lib/waste/container.schema";
import { openWasteContainer, recordDisposal } from "@/lib/waste/container.service";
import { AccountingPeriodSchema } from "@/lib/period/period.schema";
import { closePeriod, openPeriod } from "@/lib/period/period.service";

type Handler = { schema: z.ZodType; apply: (db: Db, actor: Actor, input: unknown) => Promise<Result<unknown>> };

const HANDLERS: Record<Exclude<Op["kind"], "closePeriod">, Handler> = {
  source: { schema: SourceSchema, apply: createSource },
  sourceProfile: { schema: SourceProfileSchema, apply: saveSourceProfile },
  tank: { schema: TankSchema, apply: createTank },
  reagent: { schema: ReagentLotSchema, apply: receiveReagent },
  pickup: { schema: PickupSchema, apply: (db, actor, input) => recordPickup(db, actor, input) },
  lotFromPickups: {
    schema: LotFromPickupsSchema,
    apply: (db, actor, input) => receiveLotFromPickups(db, actor, input),
  },
  delivery: { schema: DeliveryLotSchema, apply: (db, actor, input) => receiveDelivery(db, actor, input) },
  titration: { schema: LotTitrationSchema, apply: recordTitration },
  labTest: { schema: LabTestSchema, apply: recordLabTest },
  decideLot: { schema: LotDecisionSchema, apply: decideLot },
  transfer: { schema: TransferSchema, apply: transferToTank },
  gauge: { schema: GaugeSchema, apply: recordGauge },
  planBatch: { schema: BatchPlanSchema, apply: planBatch },
  startBatch: { schema: BatchStartSchema, apply: startBatch },
  completeBatch: { schema: BatchCompleteSchema, apply: completeBatch },
  qc: { schema: QcResultSchema, apply: recordQcResult },
  decideProduct: { schema: ProductDecisionSchema, apply: decideProductLot },
  customer: { schema: CustomerSchema, apply: createCustomer },
  ship: { schema: ShipmentRecordSchema, apply: recordShipment },
  wasteContainer: { schema: WasteContainerSchema, apply: openWasteContainer },
  disposal: { schema: DisposalSchema, apply: recordDisposal },
  period: { schema: AccountingPeriodSchema, apply: openPeriod },
};

export class SeedError extends Error {
  override name = "SeedError";
}

function describe(row: number, op: Op, issues: DomainIssue[]): string {
  return issues.map((i) => `demo row ${row} (${op.kind}): ${i.field ? `${i.field}: ` : ""}${i.message}`).join("\n");
}

/** Parses every operation before any write; throws one error listing every bad row and field. */
export function validateScenario(ops: Op[]): void {
  const problems: string[] = [];
  ops.forEach((op, i) => {
    if (op.kind === "closePeriod") return;
    const parsed = parseInput(HANDLERS[op.kind].schema, op.input);
    if (!parsed.ok) problems.push(describe(i + 1, op, parsed.issues));
  });
  if (problems.length)
    throw new SeedError(`The demo data has ${problems.length} bad row(s):\n${problems.slice(0, 50).join("\n")}`);
}

/** Writes the scenario through the services, in order. */
export async function writeScenario(
  db: Db,
  ops: Op[],
  onProgress?: (done: number, total: number) => void,
): Promise<{ siteId: number }> {
  const site = await insertSite(db, SITE);
  const ids = new Map<string, number>();
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  for (const p of PEOPLE)
    ids.set(
      p.login,
      (await insertUser(db, { siteId: site.id, login: p.login, fullName: p.fullName, role: p.role, passwordHash })).id,
    );
  const periods = new Map<number, number>();
  for (const [i, op] of ops.entries()) {
    const actor: Actor = { siteId: site.id, userId: ids.get(op.actor) ?? 0, now: op.at };
    let result: Result<unknown>;
    if (op.kind === "closePeriod") {
      result = await closePeriod(db, actor, {
        periodId: periods.get(op.input.startsAt.getTime()) ?? 0,
        reason: "month end close",
      });
    } else {
      result = await HANDLERS[op.kind].apply(db, actor, op.input);
      if (op.kind === "period" && result.ok)
        periods.set(
          new Date(op.input.startsAt as string | number | Date).getTime(),
          (result.value as { id: number }).id,
        );
    }
    if (!result.ok) throw new SeedError(describe(i + 1, op, result.issues));
    if (onProgress && (i + 1) % 1000 === 0) onProgress(i + 1, ops.length);
  }
  // One source check over the whole demo, as compliance would run it from the queue page.
  const first = ops[0]?.at ?? new Date();
  const last = ops[ops.length - 1]?.at ?? new Date();
  const compliance = PEOPLE.find((p) => p.role === "COMPLIANCE")?.login ?? "";
  await runScreen(
    db,
    { siteId: site.id, userId: ids.get(compliance) ?? 0, now: last },
    null,
    first,
    new Date(last.getTime() + 86_400_000),
  );
  return { siteId: site.id };
}

export function demoAnchor(): Date {
  const fixed = process.env.DEMO_ANCHOR;
  const d = fixed ? new Date(fixed) : new Date();
  if (Number.isNaN(d.getTime())) throw new SeedError(`DEMO_ANCHOR must be a date (YYYY-MM-DD), got "${fixed}"`);
  return new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));
}

async function truncateAll(db: Db): Promise<void> {
  const tables = await db.$queryRawUnsafe<Array<{ tablename: string }>>(
    "SELECT tablename FROM pg_tables WHERE schemaname = current_schema() AND tablename <> '_prisma_migrations'",
  );
  if (tables.length)
    await db.$executeRawUnsafe(`TRUNCATE ${tables.map((t) => `"${t.tablename}"`).join(", ")} RESTART IDENTITY CASCADE`);
}

/** Loads the demo into url if it holds no site yet (or always, with reset). Returns false when skipped. */
export async function loadDemo(
  url: string,
  opts: { reset?: boolean; log?: (s: string) => void } = {},
): Promise<boolean> {
  const log = opts.log ?? (() => {});
  const days = process.env.DEMO_DAYS ? Number(process.env.DEMO_DAYS) : undefined;
  const ops = buildScenario({ anchor: demoAnchor(), ...(days && days > 0 ? { days } : {}) });
  validateScenario(ops);
  if (isPostgresUrl(url)) {
    await deploy(url);
    const db = await openDb(url);
    try {
      if ((await countSites(db)) > 0) {
        if (!opts.reset) return false;
        await truncateAll(db);
      }
      try {
        await writeScenario(db, ops, (d, n) => log(`  ${d}/${n}`));
      } catch (e) {
        await truncateAll(db); // a partial demo is never left behind
        throw e;
      }
      return true;
    } finally {
      await db.$disconnect();
    }
  }
  const file = path.resolve(sqliteFilePath(url));
  if (existsSync(file) && !opts.reset) {
    await deploy(url);
    const db = await openDb(url);
    const sites = await countSites(db).finally(() => db.$disconnect());
    if (sites > 0) return false;
  }
  const side = `${file}.loading`;
  for (const f of [side, `${side}-wal`, `${side}-shm`]) rmSync(f, { force: true });
  await deploy(`file:${side}`);
  const db = await openDb(`file:${side}`);
  try {
    await writeScenario(db, ops, (d, n) => log(`  ${d}/${n}`));
    await db.$queryRawUnsafe("PRAGMA wal_checkpoint(TRUNCATE)");
  } catch (e) {
    await db.$disconnect();
    for (const f of [side, `${side}-wal`, `${side}-shm`]) rmSync(f, { force: true });
    throw e;
  }
  await db.$disconnect();
  for (const f of [`${file}-wal`, `${file}-shm`]) rmSync(f, { force: true });
  renameSync(side, file);
  rmSync(`${side}-wal`, { force: true });
  rmSync(`${side}-shm`, { force: true });
  return true;
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) {
  const url = process.env.DATABASE_URL ?? DEFAULT_DATABASE_URL;
  const reset = process.argv.includes("--reset");
  const started = Date.now();
  loadDemo(url, { reset, log: (s) => console.log(s) })
    .then((loaded) => {
      console.log(
        loaded
          ? `Demo plant loaded in ${((Date.now() - started) / 1000).toFixed(1)} s.`
          : "Database already holds data; demo not loaded (use npm run db:reset-demo to replace it).",
      );
      process.exit(0);
    })
    .catch((e: unknown) => {
      console.error(e instanceof Error ? e.message : e);
      process.exit(1);
    });
}
