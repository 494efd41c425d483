import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import type { Source } from "@/lib/source/source.schema";
import { reject } from "@/lib/ledger/transaction.store";

export async function insertSource(tx: Tx, siteId: number, s: Source): Promise<{ id: number; code: string }> {
  const clash = await tx.source.findUnique({ where: { siteId_code: { siteId, code: s.code } }, select: { id: true } });
  if (clash) reject("RECORD.DUPLICATE", `Source ${s.code} already exists`, "code");
  return tx.source.create({
    data: {
      siteId,
      code: s.code,
      name: s.name,
      kind: s.kind,
      materials: s.materials.join(","),
      address: s.address,
      certificateNo: s.certificateNo ?? null,
      certificateScheme: s.certificateScheme ?? null,
      certificateExpires: s.certificateExpires ?? null,
      pickupEveryDays: s.pickupEveryDays ?? null,
      collectorNote: s.collectorNote,
    },
    select: { id: true, code: true },
  });
}

/** Active source ids for many codes at once; an unknown or inactive code is refused naming its own field. */
export async function requireSourceIds(
  tx: Tx,
  siteId: number,
  wanted: ReadonlyArray<{ code: string; field: string }>,
): Promise<Map<string, number>> {
  const codes = [...new Set(wanted.map((w) => w.code))];
  const found = new Map<string, { id: number; active: boolean }>();
  for (let i = 0; i < codes.length; i += 500) {
    for (const s of await tx.source.findMany({
      where: { siteId, code: { in: codes.slice(i, i + 500) } },
      select: { id: true, code: true, active: true },
    }))
      found.set(s.code, s);
  }
  for (const w of wanted) {
    const s = found.get(w.code);
    if (!s) reject("RECORD.NOT_FOUND", `Source ${w.code} does not exist`, w.field);
    if (!s.active) reject("SOURCE.INACTIVE", `Source ${w.code} is no longer active`, w.field);
  }
  return new Map([...found].map(([code, s]) => [code, s.id]));
}

export async function requireSourceId(tx: Tx, siteId: number, code: string, field: string): Promise<number> {
  const s = await tx.source.findUnique({
    where: { siteId_code: { siteId, code } },
    select: { id: true, active: true },
  });
  if (!s) reject("RECORD.NOT_FOUND", `Source ${code} does not exist`, field);
  if (!s.active) reject("SOURCE.INACTIVE", `Source ${code} is no longer active`, field);
  return s.id;
}

export interface SourceRow {
  id: number;
  code: string;
  name: string;
  kind: string;
  materials: string[];
  address: string;
  certificateNo: string | null;
  certificateScheme: string | null;
  certificateExpires: Date | null;
  pickupEveryDays: number | null;
  pickups: number;
  lastPickupAt: Date | null;
}

export async function listSources(db: Db, siteId: number): Promise<SourceRow[]> {
  const rows = await db.source.findMany({
    where: { siteId },
    orderBy: { code: "asc" },
    include: {
      _count: { select: { pickups: true } },
      pickups: { orderBy: { observedAt: "desc" }, take: 1, select: { observedAt: true } },
    },
  });
  return rows.map((r) => ({
    id: r.id,
    code: r.code,
    name: r.name,
    kind: r.kind,
    materials: r.materials.split(",").filter(Boolean),
    address: r.address,
    certificateNo: r.certificateNo,
    certificateScheme: r.certificateScheme,
    certificateExpires: r.certificateExpires,
    pickupEveryDays: r.pickupEveryDays,
    pickups: r._count.pickups,
    lastPickupAt: r.pickups[0]?.observedAt ?? null,
  }));
}

export async function countSources(db: Db, siteId: number): Promise<number> {
  return db.source.count({ where: { siteId } });
}
