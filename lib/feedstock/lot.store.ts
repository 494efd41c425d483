import "server-only";
import { toFfaBasis } from "@/lib/titration/titration";
import { combineFfaReadings } from "@/lib/titration/replicates";
import type { FfaBasis } from "@/lib/titration/titration";
import type { Db, Tx } from "@/lib/core/connect";
import type { Measured } from "@/lib/feedstock/measure";
import { reject } from "@/lib/ledger/transaction.store";
import type { MaterialKind } from "@/lib/core/vocabulary";
import { toMillilitres } from "@/lib/quantity/units";

interface LotCore {
  code: string;
  material: MaterialKind;
  receivedAt: Date;
  observedVolumeL: number;
  observedTempC: number;
  certified: boolean;
  notes: string;
}

export async function insertLot(
  tx: Tx,
  r: {
    siteId: number;
    holderId: number;
    origin: "PICKUPS" | "DELIVERY";
    supplierId?: number;
    deliveryDocument?: string;
    input: LotCore;
    measured: Measured;
  },
): Promise<{ id: number; code: string }> {
  const l = r.input;
  return tx.feedstockLot.create({
    data: {
      siteId: r.siteId,
      holderId: r.holderId,
      code: l.code,
      material: l.material,
      origin: r.origin,
      supplierId: r.supplierId ?? null,
      deliveryDocument: r.deliveryDocument ?? null,
      receivedAt: l.receivedAt,
      observedVolumeMl: toMillilitres(l.observedVolumeL),
      observedTempC: l.observedTempC,
      densityKgM3: r.measured.densityKgM3,
      referenceTempC: r.measured.referenceTempC,
      densitySource: r.measured.densitySource,
      standardVolumeMl: r.measured.standardVolumeMl,
      massG: r.measured.massG,
      status: "QUARANTINED",
      certified: l.certified,
      notes: l.notes,
    },
    select: { id: true, code: true },
  });
}

export async function requireLot(tx: Tx, siteId: number, code: string, field: string) {
  const lot = await tx.feedstockLot.findUnique({
    where: { siteId_code: { siteId, code } },
    select: { id: true, holderId: true, status: true, material: true, screeningHold: true },
  });
  if (!lot) reject("RECORD.NOT_FOUND", `Lot ${code} does not exist`, field);
  return lot;
}

/** The site's sink for recorded losses (one per site, created on first use). */
export async function siteLossHolder(tx: Tx, siteId: number): Promise<number> {
  const found = await tx.holder.findUnique({
    where: { siteId_kind_code: { siteId, kind: "LOSS", code: "LOSSES" } },
    select: { id: true },
  });
  if (found) return found.id;
  return (await tx.holder.create({ data: { siteId, kind: "LOSS", code: "LOSSES" }, select: { id: true } })).id;
}

export interface LotRow {
  id: number;
  code: string;
  material: string;
  origin: string;
  receivedAt: Date;
  status: string;
  certified: boolean;
  massG: number;
  stockG: number;
  standardVolumeMl: number;
  /** Mean of the valid titrations as ffaBasis, each converted through its acid value. */
  ffaPct: number | null;
  ffaBasis: FfaBasis;
  waterPct: number | null;
  pickups: number;
  supplier: string | null;
}

export async function listLots(
  db: Db,
  siteId: number,
  opts: { status?: string; skip?: number; take?: number } = {},
): Promise<{ rows: LotRow[]; total: number }> {
  const where = { siteId, ...(opts.status ? { status: opts.status } : {}) };
  const [rows, total] = await Promise.all([
    db.feedstockLot.findMany({
      where,
      orderBy: [{ receivedAt: "desc" }, { id: "desc" }],
      skip: opts.skip ?? 0,
      take: opts.take ?? 100,
      include: {
        holder: { select: { stockG: true } },
        titrations: {
          where: { voided: false },
          orderBy: { testedAt: "desc" },
          select: { ffaPct: true, basis: true, acidValue: true },
        },
        labTests: {
          where: { voided: false, kind: "WATER" },
          orderBy: { testedAt: "desc" },
          take: 1,
          select: { valuePct: true },
        },
        supplier: { select: { name: true } },
        _count: { select: { pickups: true } },
      },
    }),
    db.feedstockLot.count({ where }),
  ]);
  return {
    total,
    rows: rows.map((r) => ({
      id: r.id,
      code: r.code,
      material: r.material,
      origin: r.origin,
      receivedAt: r.receivedAt,
      status: r.status,
      certified: r.certified,
      massG: r.massG,
      stockG: r.holder.stockG,
      standardVolumeMl: r.standardVolumeMl,
      ...meanFfa(r.titrations),
      waterPct: r.labTests[0]?.valuePct ?? null,
      pickups: r._count.pickups,
      supplier: r.supplier?.name ?? null,
    })),
  };
}

export interface PickupForLot {
  id: number;
  code: string;
  holderId: number;
  lotId: number | null;
  observedAt: Date;
  stockG: number;
}

export async function findPickupsByCode(tx: Tx, siteId: number, codes: string[]): Promise<PickupForLot[]> {
  const rows = await tx.pickup.findMany({
    where: { siteId, code: { in: codes } },
    select: {
      id: true,
      code: true,
      holderId: true,
      lotId: true,
      observedAt: true,
      holder: { select: { stockG: true } },
    },
  });
  return rows.map(({ holder, ...p }) => ({ ...p, stockG: holder.stockG }));
}

export async function linkPickupToLot(tx: Tx, pickupId: number, lotId: number): Promise<void> {
  await tx.pickup.update({ where: { id: pickupId }, data: { lotId } });
}

export async function insertLabTest(
  tx: Tx,
  t: { lotId: number; analystId: number; testedAt: Date; kind: string; method: string; valuePct: number },
): Promise<{ id: number }> {
  return tx.labTest.create({ data: t, select: { id: true } });
}

export async function countValidTitrations(tx: Tx, lotId: number): Promise<number> {
  return tx.titration.count({ where: { lotId, voided: false } });
}

export async function setLotStatus(tx: Tx, lotId: number, status: string): Promise<void> {
  await tx.feedstockLot.update({ where: { id: lotId }, data: { status } });
}

/** A source check's hold: the lot waits (awaiting lab) and cannot be accepted until the hold is lifted. */
export async function setLotScreeningHold(tx: Tx, lotId: number, hold: boolean): Promise<void> {
  await tx.feedstockLot.update({
    where: { id: lotId },
    data: hold ? { screeningHold: true, status: "QUARANTINED" } : { screeningHold: false },
  });
}

export async function insertTitration(
  tx: Tx,
  t: {
    lotId: number;
    analystId: number;
    testedAt: Date;
    sampleMassG: number;
    titrant: string;
    concentrationMolL: number;
    titreMl: number;
    blankMl: number;
    basis: string;
    ffaPct: number;
    acidValue: number;
  },
): Promise<{ id: number; ffaPct: number; acidValue: number }> {
  return tx.titration.create({ data: t, select: { id: true, ffaPct: true, acidValue: true } });
}

function meanFfa(titrations: ReadonlyArray<{ ffaPct: number; basis: string; acidValue: number }>): {
  ffaPct: number | null;
  ffaBasis: FfaBasis;
} {
  const mean = combineFfaReadings(
    titrations.map((t) => ({ ffaPct: t.ffaPct, basis: toFfaBasis(t.basis), acidValueMgKohG: t.acidValue })),
  );
  return mean.ok ? { ffaPct: mean.value.ffaPct, ffaBasis: mean.value.basis } : { ffaPct: null, ffaBasis: "OLEIC" };
}
