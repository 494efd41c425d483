import "server-only";
// Grid rows of what comes in: sources, pickups, lots and their lab results.
import type { Db, Tx } from "@/lib/core/connect";
import type { Prisma } from "@/lib/generated/sqlite/client";
import type { RowsPage, TableQuery } from "@/lib/grid/grid-query";
import { iso, kg, litres } from "@/lib/grid/grid-query";
import { sumOf } from "@/lib/grid/sum.store";

async function sourcesRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
  const [rows, count] = await Promise.all([
    db.source.findMany({ ...(t as Prisma.SourceFindManyArgs) }),
    db.source.count({ where: t.where }),
  ]);
  return {
    lastRow: count,
    totals: { massKg: null, volumeL: null },
    rows: rows.map((s) => ({
      id: s.id,
      code: s.code,
      name: s.name,
      kind: s.kind,
      materials: s.materials.split(",").filter(Boolean).join(", "),
      address: s.address,
      certificateNo: s.certificateNo,
      certificateScheme: s.certificateScheme,
      certificateExpires: iso(s.certificateExpires),
      pickupEveryDays: s.pickupEveryDays,
      collectorNote: s.collectorNote,
      active: s.active,
    })),
  };
}

async function pickupsRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
  const [rows, { count, sums }] = await Promise.all([
    db.pickup.findMany({
      ...(t as Prisma.PickupFindManyArgs),
      include: { source: { select: { code: true } }, lot: { select: { code: true } } },
    }),
    sumOf(db, "pickup", t.where, ["massG", "volumeMl"]),
  ]);
  return {
    lastRow: count,
    totals: { massKg: kg(sums.massG), volumeL: litres(sums.volumeMl) },
    rows: rows.map((p) => ({
      id: p.id,
      code: p.code,
      sourceCode: p.source.code,
      material: p.material,
      observedAt: iso(p.observedAt),
      containers: p.containers,
      containerTags: p.containerTags.split(",").filter(Boolean).join(", "),
      volumeL: litres(p.volumeMl),
      tempC: p.tempC,
      massKg: kg(p.massG),
      waterLook: p.waterLook,
      solidsLook: p.solidsLook,
      notes: p.notes,
      lotCode: p.lot?.code ?? null,
      receivedAt: iso(p.receivedAt),
    })),
  };
}

async function lotsRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
  const [rows, { count, sums }] = await Promise.all([
    db.feedstockLot.findMany({
      ...(t as Prisma.FeedstockLotFindManyArgs),
      include: {
        supplier: { select: { code: true } },
        holder: { select: { stockG: true } },
        pickups: { select: { code: true } },
        titrations: {
          where: { voided: false },
          orderBy: [{ testedAt: "desc" }, { id: "desc" }],
          take: 1,
          select: { ffaPct: true },
        },
      },
    }),
    sumOf(db, "feedstockLot", t.where, ["massG", "standardVolumeMl"]),
  ]);
  return {
    lastRow: count,
    totals: { massKg: kg(sums.massG), volumeL: litres(sums.standardVolumeMl) },
    rows: rows.map((l) => ({
      id: l.id,
      code: l.code,
      material: l.material,
      origin: l.origin,
      supplierCode: l.supplier?.code ?? null,
      deliveryDocument: l.deliveryDocument,
      pickupCodes: l.pickups.map((p) => p.code).join(", "),
      receivedAt: iso(l.receivedAt),
      observedVolumeL: litres(l.observedVolumeMl),
      observedTempC: l.observedTempC,
      densityKgM3: l.densityKgM3,
      standardVolumeL: litres(l.standardVolumeMl),
      massKg: kg(l.massG),
      stockKg: kg(l.holder.stockG),
      ffaPct: l.titrations[0]?.ffaPct ?? null,
      status: l.status,
      certified: l.certified,
      notes: l.notes,
    })),
  };
}

async function titrationsRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
  const [rows, count] = await Promise.all([
    db.titration.findMany({
      ...(t as Prisma.TitrationFindManyArgs),
      include: { lot: { select: { code: true } }, analyst: { select: { fullName: true } } },
    }),
    db.titration.count({ where: t.where }),
  ]);
  return {
    lastRow: count,
    totals: { massKg: null, volumeL: null },
    rows: rows.map((x) => ({
      id: x.id,
      lotCode: x.lot.code,
      testedAt: iso(x.testedAt),
      sampleMassG: x.sampleMassG,
      titrant: x.titrant,
      concentrationMolL: x.concentrationMolL,
      titreMl: x.titreMl,
      blankMl: x.blankMl,
      basis: x.basis,
      ffaPct: x.ffaPct,
      acidValue: x.acidValue,
      analyst: x.analyst.fullName,
      voided: x.voided,
    })),
  };
}

async function labTestsRows(db: Db | Tx, t: TableQuery): Promise<RowsPage> {
  const [rows, count] = await Promise.all([
    db.labTest.findMany({
      ...(t as Prisma.LabTestFindManyArgs),
      include: { lot: { select: { code: true } }, analyst: { select: { fullName: true } } },
    }),
    db.labTest.count({ where: t.where }),
  ]);
  return {
    lastRow: count,
    totals: { massKg: null, volumeL: null },
    rows: rows.map((x) => ({
      id: x.id,
      lotCode: x.lot.code,
      testedAt: iso(x.testedAt),
      kind: x.kind,
      method: x.method,
      valuePct: x.valuePct,
      analyst: x.analyst.fullName,
      voided: x.voided,
    })),
  };
}

export const INTAKE_ROWS = {
  sources: sourcesRows,
  pickups: pickupsRows,
  lots: lotsRows,
  titrations: titrationsRows,
  labTests: labTestsRows,
} as const;
