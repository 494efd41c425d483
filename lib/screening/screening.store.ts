import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import type { Flag } from "@/lib/screening/screening";

export interface SourceScreenRow {
  id: number;
  code: string;
  name: string;
  kind: string;
  capacityBasis: string | null;
  fryers: number | null;
  fryerLitres: number | null;
  changesPerWeek: number | null;
  declaredLitresPerMonth: number | null;
  opensHour: number | null;
  closesHour: number | null;
  certificateNo: string | null;
  certificateExpires: Date | null;
}

export interface PickupScreenRow {
  code: string;
  sourceId: number;
  observedAt: Date;
  volumeMl: number;
  phoneDistanceBand: string | null;
  lot: { code: string; certified: boolean } | null;
}

export interface LotScreenRow {
  code: string;
  receivedAt: Date;
  material: string;
  densityKgM3: number;
  densitySource: string;
  supplierId: number | null;
  /** Sources that gave at least half of the lot's pickup litres: a pooled lot's lab results speak for its main source only. */
  mainSourceIds: number[];
  acidValue: number | null;
  waterPct: number | null;
  insolublesPct: number | null;
}

const SOURCE_SELECT = {
  id: true,
  code: true,
  name: true,
  kind: true,
  capacityBasis: true,
  fryers: true,
  fryerLitres: true,
  changesPerWeek: true,
  declaredLitresPerMonth: true,
  opensHour: true,
  closesHour: true,
  certificateNo: true,
  certificateExpires: true,
} as const;

export async function listScreenSources(db: Db, siteId: number, kind?: string): Promise<SourceScreenRow[]> {
  return db.source.findMany({
    where: { siteId, ...(kind === undefined ? {} : { kind }) },
    select: SOURCE_SELECT,
    orderBy: { code: "asc" },
  });
}

export async function listScreenPickups(
  db: Db,
  siteId: number,
  sourceIds: readonly number[] | null,
  from: Date,
  to: Date,
): Promise<PickupScreenRow[]> {
  return db.pickup.findMany({
    where: {
      siteId,
      observedAt: { gte: from, lt: to },
      ...(sourceIds === null ? {} : { sourceId: { in: [...sourceIds] } }),
    },
    select: {
      code: true,
      sourceId: true,
      observedAt: true,
      volumeMl: true,
      phoneDistanceBand: true,
      lot: { select: { code: true, certified: true } },
    },
    orderBy: [{ observedAt: "asc" }, { id: "asc" }],
  });
}

/** Lots received in the window with their latest valid acid value, water and insolubles. */
export async function listScreenLots(db: Db, siteId: number, from: Date, to: Date): Promise<LotScreenRow[]> {
  const rows = await db.feedstockLot.findMany({
    where: { siteId, receivedAt: { gte: from, lt: to } },
    select: {
      code: true,
      receivedAt: true,
      material: true,
      densityKgM3: true,
      densitySource: true,
      supplierId: true,
      pickups: { select: { sourceId: true, volumeMl: true } },
      titrations: {
        where: { voided: false },
        select: { acidValue: true, testedAt: true },
        orderBy: { testedAt: "desc" },
        take: 1,
      },
      labTests: {
        where: { voided: false, kind: { in: ["WATER", "INSOLUBLES"] } },
        select: { kind: true, valuePct: true, testedAt: true },
        orderBy: { testedAt: "desc" },
      },
    },
    orderBy: { receivedAt: "asc" },
  });
  return rows.map((r) => ({
    code: r.code,
    receivedAt: r.receivedAt,
    material: r.material,
    densityKgM3: r.densityKgM3,
    densitySource: r.densitySource,
    supplierId: r.supplierId,
    mainSourceIds: mainSources(r.pickups),
    acidValue: r.titrations[0]?.acidValue ?? null,
    waterPct: r.labTests.find((t) => t.kind === "WATER")?.valuePct ?? null,
    insolublesPct: r.labTests.find((t) => t.kind === "INSOLUBLES")?.valuePct ?? null,
  }));
}

function mainSources(pickups: ReadonlyArray<{ sourceId: number; volumeMl: number }>): number[] {
  const total = pickups.reduce((a, p) => a + p.volumeMl, 0);
  const by = new Map<number, number>();
  for (const p of pickups) by.set(p.sourceId, (by.get(p.sourceId) ?? 0) + p.volumeMl);
  return [...by].filter(([, ml]) => total > 0 && ml * 2 >= total).map(([id]) => id);
}

/** Source ids behind pickups and lots, for screening only those sources. */
export async function findSourceIdsOf(
  db: Db,
  siteId: number,
  pickupCodes: readonly string[],
  lotCodes: readonly string[],
): Promise<number[]> {
  const [pickups, lots] = await Promise.all([
    pickupCodes.length === 0
      ? []
      : db.pickup.findMany({ where: { siteId, code: { in: [...pickupCodes] } }, select: { sourceId: true } }),
    lotCodes.length === 0
      ? []
      : db.feedstockLot.findMany({
          where: { siteId, code: { in: [...lotCodes] } },
          select: { supplierId: true, pickups: { select: { sourceId: true } } },
        }),
  ]);
  const ids = new Set<number>(pickups.map((p) => p.sourceId));
  for (const l of lots) {
    if (l.supplierId !== null) ids.add(l.supplierId);
    for (const p of l.pickups) ids.add(p.sourceId);
  }
  return [...ids];
}

/** Saves new flags; a flag already raised (whatever its state) is left as it is, so a rerun never reopens a decision. */
export async function saveFlags(
  tx: Tx,
  siteId: number,
  raised: ReadonlyArray<{ sourceId: number; flag: Flag }>,
  at: Date,
): Promise<number> {
  let created = 0;
  for (const { sourceId, flag: f } of raised) {
    const key = { siteId_sourceId_signal_subjectKey: { siteId, sourceId, signal: f.signal, subjectKey: f.subjectKey } };
    const existing = await tx.screeningFlag.findUnique({ where: key, select: { id: true, status: true } });
    const data = {
      message: f.message,
      measured: f.measured,
      threshold: f.threshold,
      pickupCodes: f.pickupCodes.join(","),
      lotCodes: f.lotCodes.join(","),
    };
    if (existing === null) {
      await tx.screeningFlag.create({
        data: { siteId, sourceId, signal: f.signal, subjectKey: f.subjectKey, raisedAt: at, ...data },
      });
      created++;
    } else if (existing.status === "OPEN") {
      await tx.screeningFlag.update({ where: { id: existing.id }, data });
    }
  }
  return created;
}

export interface FlagRow {
  id: number;
  sourceId: number;
  sourceCode: string;
  sourceName: string;
  signal: string;
  subjectKey: string;
  message: string;
  measured: number;
  threshold: number;
  pickupCodes: string[];
  lotCodes: string[];
  raisedAt: Date;
  status: string;
  decidedAt: Date | null;
  decidedBy: string | null;
  reason: string;
  heldLots: string[];
}

const list = (s: string) => s.split(",").filter(Boolean);

export async function listFlags(
  db: Db,
  siteId: number,
  opts: { status?: readonly string[]; sourceId?: number; take?: number } = {},
): Promise<FlagRow[]> {
  const rows = await db.screeningFlag.findMany({
    where: {
      siteId,
      ...(opts.status ? { status: { in: [...opts.status] } } : {}),
      ...(opts.sourceId === undefined ? {} : { sourceId: opts.sourceId }),
    },
    include: { source: { select: { code: true, name: true } } },
    orderBy: [{ raisedAt: "desc" }, { id: "desc" }],
    take: opts.take ?? 500,
  });
  const deciders = [...new Set(rows.flatMap((r) => (r.decidedById === null ? [] : [r.decidedById])))];
  const names = new Map(
    (await db.user.findMany({ where: { id: { in: deciders } }, select: { id: true, fullName: true } })).map((u) => [
      u.id,
      u.fullName,
    ]),
  );
  return rows.map((r) => ({
    id: r.id,
    sourceId: r.sourceId,
    sourceCode: r.source.code,
    sourceName: r.source.name,
    signal: r.signal,
    subjectKey: r.subjectKey,
    message: r.message,
    measured: r.measured,
    threshold: r.threshold,
    pickupCodes: list(r.pickupCodes),
    lotCodes: list(r.lotCodes),
    raisedAt: r.raisedAt,
    status: r.status,
    decidedAt: r.decidedAt,
    decidedBy: r.decidedById === null ? null : (names.get(r.decidedById) ?? null),
    reason: r.reason,
    heldLots: list(r.heldLots),
  }));
}

export async function countOpenFlags(db: Db, siteId: number): Promise<number> {
  return db.screeningFlag.count({ where: { siteId, status: "OPEN" } });
}

export async function requireFlag(tx: Tx, siteId: number, id: number) {
  return tx.screeningFlag.findFirst({
    where: { siteId, id },
    include: { source: { select: { id: true, code: true, onWatch: true, creditWithheld: true } } },
  });
}

export async function setFlagDecision(
  tx: Tx,
  id: number,
  d: { status: string; decidedAt: Date; decidedById: number; reason: string; heldLots?: string[] },
): Promise<void> {
  await tx.screeningFlag.update({
    where: { id },
    data: {
      status: d.status,
      decidedAt: d.decidedAt,
      decidedById: d.decidedById,
      reason: d.reason,
      ...(d.heldLots ? { heldLots: d.heldLots.join(",") } : {}),
    },
  });
}

export async function setSourceStanding(
  tx: Tx,
  sourceId: number,
  s: { onWatch?: boolean; creditWithheld?: boolean },
): Promise<void> {
  await tx.source.update({ where: { id: sourceId }, data: s });
}

/** Accepted or awaiting-lab lots from the source with stock still on site. */
export async function listOnSiteLotsOf(
  tx: Tx,
  siteId: number,
  sourceId: number,
): Promise<Array<{ id: number; code: string; status: string; screeningHold: boolean }>> {
  return tx.feedstockLot.findMany({
    where: {
      siteId,
      status: { in: ["ACCEPTED", "QUARANTINED"] },
      holder: { stockG: { gt: 0 } },
      OR: [{ supplierId: sourceId }, { pickups: { some: { sourceId } } }],
    },
    select: { id: true, code: true, status: true, screeningHold: true },
    orderBy: { code: "asc" },
  });
}

export async function listConfirmedFlagsOf(
  tx: Tx,
  siteId: number,
  sourceId: number,
): Promise<Array<{ id: number; heldLots: string }>> {
  return tx.screeningFlag.findMany({
    where: { siteId, sourceId, status: "CONFIRMED" },
    select: { id: true, heldLots: true },
  });
}
