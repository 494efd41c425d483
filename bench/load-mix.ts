// What a load run sends: the floor (a signed-in JSON answer and a signed-in page that do nothing else),
// the read mix people use all day, and the same mix with one request in ten a booking (pickups posted,
// lots moved into tanks), each booking with its own idempotency key. Codes are read from the demo
// database the server was started on; after a run the books are checked for over-draws.
import { randomUUID } from "node:crypto";
import type { Db } from "@/lib/core/connect";
import { dialectOf } from "@/lib/core/bulk-insert";

export interface MixRequest {
  route: string;
  method: "GET" | "POST";
  path: string;
  kind: "json" | "page" | "write";
  /** The session cookie's owner. */
  as: "reader" | "writer";
  body?: () => string;
}

export interface DemoCodes {
  shipment: string;
  lot: string;
  source: string;
  material: string;
  transfers: Array<{ fromKind: "TANK" | "LOT"; fromCode: string; toTankCode: string }>;
}

export const READER_LOGIN = "compliance.nell";
export const WRITER_LOGIN = "production.tess";
export const DEMO_PASSWORD = "quillmoor-demo";

/** The read mix: four JSON answers and three pages, each once per round. */
export function readMix(c: DemoCodes): MixRequest[] {
  return [
    { route: "page /", method: "GET", path: "/", kind: "page", as: "reader" },
    {
      route: "json trace backward (shipment)",
      method: "GET",
      path: `/api/trace/backward?kind=SHIPMENT&code=${encodeURIComponent(c.shipment)}`,
      kind: "json",
      as: "reader",
    },
    { route: "page /lots", method: "GET", path: "/lots", kind: "page", as: "reader" },
    {
      route: "json trace forward (lot)",
      method: "GET",
      path: `/api/trace/forward?kind=LOT&code=${encodeURIComponent(c.lot)}`,
      kind: "json",
      as: "reader",
    },
    {
      route: "json balance (last month)",
      method: "GET",
      path: "/api/balance?period=MONTH",
      kind: "json",
      as: "reader",
    },
    { route: "page /waste/due", method: "GET", path: "/waste/due", kind: "page", as: "reader" },
    {
      route: "json grid rows (pickups)",
      method: "GET",
      path: "/api/grid/rows?table=pickups&start=0&end=100",
      kind: "json",
      as: "reader",
    },
  ];
}

/** The floor in the mix's own proportions of JSON answers and pages. */
export function floorMix(mix: readonly MixRequest[]): MixRequest[] {
  return mix.map((m) =>
    m.kind === "page"
      ? { route: "page /me/signed-in", method: "GET", path: "/me/signed-in", kind: "page", as: "reader" }
      : { route: "json /api/me", method: "GET", path: "/api/me", kind: "json", as: "reader" },
  );
}

let serial = 0;

function pickupBody(c: DemoCodes): string {
  serial += 1;
  const observedAt = new Date(Date.now() - 3_600_000).toISOString();
  return JSON.stringify({
    code: `LD-${process.pid}-${Date.now().toString(36)}-${serial}`.toUpperCase(),
    sourceCode: c.source,
    material: c.material,
    observedAt,
    containers: 1,
    volumeL: 120,
    tempC: 20,
    idempotencyKey: randomUUID(),
  });
}

function transferBody(c: DemoCodes): string {
  serial += 1;
  const t = c.transfers[serial % c.transfers.length];
  if (t === undefined) throw new Error("no lot-to-tank transfer found in the demo");
  return JSON.stringify({
    fromCode: t.fromCode,
    fromKind: t.fromKind,
    toTankCode: t.toTankCode,
    at: new Date(Date.now() - 60_000).toISOString(),
    massKg: 1,
    note: "load run",
  });
}

/**
 * The read mix (or the one given) with every tenth request a booking: 20 requests per round, 18 reads,
 * 1 pickup, 1 transfer.
 */
export function writeMix(c: DemoCodes, reads: readonly MixRequest[] = readMix(c)): MixRequest[] {
  const out: MixRequest[] = [];
  for (let i = 0; i < 18; i++) {
    const r = reads[i % reads.length];
    if (r !== undefined) out.push(r);
    if (i === 8)
      out.push({
        route: "write pickup",
        method: "POST",
        path: "/api/pickups",
        kind: "write",
        as: "writer",
        body: () => pickupBody(c),
      });
    if (i === 17)
      out.push({
        route: "write transfer",
        method: "POST",
        path: "/api/transfers",
        kind: "write",
        as: "writer",
        body: () => transferBody(c),
      });
  }
  return out;
}

/** Codes to ask about: the last shipment, the latest lot, a source with pickups, and feedstock tanks and lots with stock to draw 1 kg from. */
export async function readDemoCodes(
  db: Db,
): Promise<Omit<DemoCodes, "transfers"> & { stocked: Array<{ kind: "TANK" | "LOT"; code: string }> }> {
  const shipment = await db.holder.findFirst({
    where: { kind: "SHIPMENT" },
    orderBy: { id: "desc" },
    select: { code: true },
  });
  const lot = await db.feedstockLot.findFirst({ orderBy: { holderId: "desc" }, select: { code: true } });
  const pickup = await db.pickup.findFirst({
    orderBy: { id: "desc" },
    select: { material: true, source: { select: { code: true } } },
  });
  const tanks = await db.tank.findMany({
    where: { service: "FEEDSTOCK", holder: { stockG: { gte: 1_000_000 } } },
    select: { holder: { select: { code: true } } },
  });
  const lots = await db.holder.findMany({
    where: { kind: "LOT", stockG: { gte: 500_000 } },
    orderBy: { stockG: "desc" },
    take: 6,
    select: { code: true },
  });
  if (!shipment || !lot || !pickup) throw new Error("the demo database has no shipment, lot or pickup");
  const stocked = [
    ...tanks.map((t) => ({ kind: "TANK" as const, code: t.holder.code })),
    ...lots.map((l) => ({ kind: "LOT" as const, code: l.code })),
  ];
  return { shipment: shipment.code, lot: lot.code, source: pickup.source.code, material: pickup.material, stocked };
}

/**
 * Over-draws after a run: holders whose book stock is below zero, or differs from what their movements
 * add up to (what came in less what went out).
 */
export async function countOverdraws(db: Db): Promise<{ negative: number; mismatched: number; holders: number }> {
  // One snapshot of the books: a booking still finishing after the last run must not fall between the
  // holders' read and the movements' read (PostgreSQL's default gives each statement its own snapshot).
  const { holders, ins, outs } = await db.$transaction(async (tx) => {
    if (dialectOf(db) === "postgresql") await tx.$executeRawUnsafe("SET TRANSACTION ISOLATION LEVEL REPEATABLE READ");
    const holders = await tx.holder.findMany({ select: { id: true, stockG: true } });
    const ins = await tx.movement.groupBy({ by: ["toHolderId"], _sum: { massG: true } });
    const outs = await tx.movement.groupBy({ by: ["fromHolderId"], _sum: { massG: true } });
    return { holders, ins, outs };
  });
  const inG = new Map(ins.map((r) => [r.toHolderId, r._sum.massG ?? 0]));
  const outG = new Map(
    outs.flatMap((r) => (r.fromHolderId === null ? [] : [[r.fromHolderId, r._sum.massG ?? 0] as const])),
  );
  let negative = 0;
  let mismatched = 0;
  for (const h of holders) {
    if (h.stockG < 0) negative += 1;
    if (h.stockG !== (inG.get(h.id) ?? 0) - (outG.get(h.id) ?? 0)) mismatched += 1;
  }
  return { negative, mismatched, holders: holders.length };
}
