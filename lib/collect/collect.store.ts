import "server-only";
import type { Db } from "@/lib/core/connect";

export interface CollectSource {
  code: string;
  name: string;
  address: string;
  materials: string[];
  pickupEveryDays: number | null;
  collectorNote: string;
  lastPickupAt: Date | null;
  /** The address's coordinates, when compliance recorded them: the phone works out a distance band against them. */
  latitude: number | null;
  longitude: number | null;
}

/** Active sources the collector can choose, with what the route needs. */
export async function listCollectSources(db: Db, siteId: number): Promise<CollectSource[]> {
  const rows = await db.source.findMany({
    where: { siteId, active: true },
    orderBy: { code: "asc" },
    select: {
      code: true,
      name: true,
      address: true,
      materials: true,
      pickupEveryDays: true,
      collectorNote: true,
      latitude: true,
      longitude: true,
      pickups: { orderBy: { observedAt: "desc" }, take: 1, select: { observedAt: true } },
    },
  });
  return rows.map((r) => ({
    code: r.code,
    name: r.name,
    address: r.address,
    materials: r.materials.split(",").filter(Boolean),
    pickupEveryDays: r.pickupEveryDays,
    collectorNote: r.collectorNote,
    lastPickupAt: r.pickups[0]?.observedAt ?? null,
    latitude: r.latitude,
    longitude: r.longitude,
  }));
}

export interface HistoryPickup {
  code: string;
  sourceCode: string;
  observedAt: Date;
  receivedAt: Date;
  containers: number;
  volumeMl: number;
  tempC: number;
  waterLook: string;
  solidsLook: string;
  collector: string;
}

const historySelect = {
  code: true,
  observedAt: true,
  receivedAt: true,
  containers: true,
  volumeMl: true,
  tempC: true,
  waterLook: true,
  solidsLook: true,
  source: { select: { code: true } },
  collector: { select: { fullName: true } },
} as const;

type HistoryRow = {
  code: string;
  observedAt: Date;
  receivedAt: Date;
  containers: number;
  volumeMl: number;
  tempC: number;
  waterLook: string;
  solidsLook: string;
  source: { code: string };
  collector: { fullName: string };
};

function toHistory(r: HistoryRow): HistoryPickup {
  return {
    code: r.code,
    sourceCode: r.source.code,
    observedAt: r.observedAt,
    receivedAt: r.receivedAt,
    containers: r.containers,
    volumeMl: r.volumeMl,
    tempC: r.tempC,
    waterLook: r.waterLook,
    solidsLook: r.solidsLook,
    collector: r.collector.fullName,
  };
}

/** The last few pickups at each source since `since`, newest first (for the source's recent history). */
export async function listRecentPickupsBySource(
  db: Db,
  siteId: number,
  since: Date,
  perSource: number,
): Promise<Map<string, HistoryPickup[]>> {
  const rows = await db.pickup.findMany({
    where: { siteId, observedAt: { gte: since } },
    orderBy: [{ observedAt: "desc" }, { id: "desc" }],
    take: 5_000,
    select: historySelect,
  });
  const bySource = new Map<string, HistoryPickup[]>();
  for (const r of rows) {
    const list = bySource.get(r.source.code) ?? [];
    if (list.length < perSource) list.push(toHistory(r));
    bySource.set(r.source.code, list);
  }
  return bySource;
}

/** What this collector's phone has delivered to the server recently, newest first. */
export async function listReceivedFromCollector(
  db: Db,
  siteId: number,
  collectorId: number,
  since: Date,
): Promise<HistoryPickup[]> {
  const rows = await db.pickup.findMany({
    where: { siteId, collectorId, receivedAt: { gte: since } },
    orderBy: [{ receivedAt: "desc" }, { id: "desc" }],
    take: 200,
    select: historySelect,
  });
  return rows.map(toHistory);
}

export interface WaitingPickup {
  code: string;
  sourceCode: string;
  sourceName: string;
  material: string;
  observedAt: Date;
  receivedAt: Date;
  collector: string;
  containers: number;
  volumeMl: number;
  tempC: number;
  massG: number;
  stockG: number;
}

/** Pickups not yet received into a lot: the plant's receiving list. */
export async function listPickupsNotInLot(db: Db, siteId: number): Promise<WaitingPickup[]> {
  const rows = await db.pickup.findMany({
    where: { siteId, lotId: null },
    orderBy: [{ observedAt: "asc" }, { id: "asc" }],
    take: 500,
    select: {
      code: true,
      material: true,
      observedAt: true,
      receivedAt: true,
      containers: true,
      volumeMl: true,
      tempC: true,
      massG: true,
      holder: { select: { stockG: true } },
      source: { select: { code: true, name: true } },
      collector: { select: { fullName: true } },
    },
  });
  return rows.map((r) => ({
    code: r.code,
    sourceCode: r.source.code,
    sourceName: r.source.name,
    material: r.material,
    observedAt: r.observedAt,
    receivedAt: r.receivedAt,
    collector: r.collector.fullName,
    containers: r.containers,
    volumeMl: r.volumeMl,
    tempC: r.tempC,
    massG: r.massG,
    stockG: r.holder.stockG,
  }));
}

/** Pickups carrying a container label, newest first (what a container label's QR code opens). */
export async function listPickupsWithContainer(
  db: Db,
  siteId: number,
  tag: string,
): Promise<Array<HistoryPickup & { lotCode: string | null }>> {
  const rows = await db.pickup.findMany({
    where: { siteId, containerTags: { contains: tag } },
    orderBy: [{ observedAt: "desc" }, { id: "desc" }],
    take: 200,
    select: { ...historySelect, containerTags: true, lot: { select: { code: true } } },
  });
  return rows
    .filter((r) => r.containerTags.split(",").includes(tag))
    .map((r) => ({ ...toHistory(r), lotCode: r.lot?.code ?? null }));
}

/** How many lots already carry this number prefix (for suggesting the next lot number). */
export async function countLotsWithPrefix(db: Db, siteId: number, prefix: string): Promise<number> {
  return db.feedstockLot.count({ where: { siteId, code: { startsWith: prefix } } });
}
