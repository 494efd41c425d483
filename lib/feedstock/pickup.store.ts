import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { insertRows } from "@/lib/core/bulk-insert";
import type { Pickup } from "@/lib/feedstock/pickup.schema";
import { toMillilitres } from "@/lib/quantity/units";

export interface PickupSaved {
  id: number;
  code: string;
  massG: number;
  receivedAt: Date;
}

type PickupInsert = {
  siteId: number;
  holderId: number;
  sourceId: number;
  collectorId: number;
  receivedAt: Date;
  massG: number;
  pickup: Pickup;
};

function pickupData(r: PickupInsert) {
  const p = r.pickup;
  return {
    siteId: r.siteId,
    holderId: r.holderId,
    code: p.code,
    sourceId: r.sourceId,
    collectorId: r.collectorId,
    material: p.material,
    observedAt: p.observedAt,
    receivedAt: r.receivedAt,
    containers: p.containers,
    containerTags: p.containerTags.join(","),
    volumeMl: toMillilitres(p.volumeL),
    tempC: p.tempC,
    massG: r.massG,
    waterLook: p.waterLook,
    solidsLook: p.solidsLook,
    notes: p.notes,
    idempotencyKey: p.idempotencyKey ?? null,
    phoneDistanceBand: p.phoneDistanceBand ?? null,
  };
}

export async function findPickupByKey(db: Db | Tx, key: string): Promise<PickupSaved | null> {
  return db.pickup.findUnique({
    where: { idempotencyKey: key },
    select: { id: true, code: true, massG: true, receivedAt: true },
  });
}

/** Which of these idempotency keys are already stored (one query per 500 keys). */
export async function findPickupKeys(db: Db | Tx, keys: readonly string[]): Promise<Set<string>> {
  const found = new Set<string>();
  for (let i = 0; i < keys.length; i += 500) {
    for (const p of await db.pickup.findMany({
      where: { idempotencyKey: { in: keys.slice(i, i + 500) } },
      select: { idempotencyKey: true },
    }))
      if (p.idempotencyKey) found.add(p.idempotencyKey);
  }
  return found;
}

export async function insertPickup(tx: Tx, r: PickupInsert): Promise<PickupSaved> {
  return tx.pickup.create({
    data: pickupData(r),
    select: { id: true, code: true, massG: true, receivedAt: true },
  });
}

const PICKUP_COLUMNS = [
  "siteId",
  "holderId",
  "code",
  "sourceId",
  "collectorId",
  "material",
  "observedAt",
  "receivedAt",
  "containers",
  "containerTags",
  "volumeMl",
  "tempC",
  "massG",
  "waterLook",
  "solidsLook",
  "notes",
  "idempotencyKey",
  "phoneDistanceBand",
] as const;

/** Many pickups at once (imports; the holders already exist with their stock): pickupData's columns in multi-row statements. */
export async function insertPickups(tx: Tx, rows: readonly PickupInsert[]): Promise<void> {
  await insertRows(
    tx,
    "Pickup",
    PICKUP_COLUMNS,
    rows.map((r) => {
      const d = pickupData(r);
      return PICKUP_COLUMNS.map((c) => d[c]);
    }),
  );
}

export interface PickupRow {
  id: number;
  code: string;
  sourceCode: string;
  sourceName: string;
  collector: string;
  material: string;
  observedAt: Date;
  receivedAt: Date;
  containers: number;
  volumeMl: number;
  tempC: number;
  massG: number;
  lotCode: string | null;
  notes: string;
}

export async function listPickups(
  db: Db,
  siteId: number,
  opts: { skip?: number; take?: number; sourceId?: number; collectorId?: number } = {},
): Promise<{ rows: PickupRow[]; total: number }> {
  const where = {
    siteId,
    ...(opts.sourceId ? { sourceId: opts.sourceId } : {}),
    ...(opts.collectorId ? { collectorId: opts.collectorId } : {}),
  };
  const [rows, total] = await Promise.all([
    db.pickup.findMany({
      where,
      orderBy: [{ observedAt: "desc" }, { id: "desc" }],
      skip: opts.skip ?? 0,
      take: opts.take ?? 100,
      include: {
        source: { select: { code: true, name: true } },
        collector: { select: { fullName: true } },
        lot: { select: { code: true } },
      },
    }),
    db.pickup.count({ where }),
  ]);
  return {
    total,
    rows: rows.map((r) => ({
      id: r.id,
      code: r.code,
      sourceCode: r.source.code,
      sourceName: r.source.name,
      collector: r.collector.fullName,
      material: r.material,
      observedAt: r.observedAt,
      receivedAt: r.receivedAt,
      containers: r.containers,
      volumeMl: r.volumeMl,
      tempC: r.tempC,
      massG: r.massG,
      lotCode: r.lot?.code ?? null,
      notes: r.notes,
    })),
  };
}

/** Pickups observed in [from, to). */
export async function countPickupsBetween(db: Db, siteId: number, from: Date, to: Date): Promise<number> {
  return db.pickup.count({ where: { siteId, observedAt: { gte: from, lt: to } } });
}
