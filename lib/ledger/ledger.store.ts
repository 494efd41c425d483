// The movement ledger: the only place that moves material between holders. Every post is a
// guarded single-statement decrement of the source holder (never read-then-write), an increment
// of the destination and one append-only ledger row, inside the caller's transaction.
import type { Db, Tx } from "@/lib/core/connect";
import { insertRows } from "@/lib/core/bulk-insert";
import type { HolderKind, MoveRole } from "@/lib/core/vocabulary";
import { labelOf } from "@/lib/core/vocabulary";
import { loadTraceLedger } from "@/lib/ledger/movement.store";
import { refuseCycle } from "@/lib/ledger/cycle";
import { reject } from "@/lib/ledger/transaction.store";

export async function createHolder(
  tx: Tx,
  siteId: number,
  kind: HolderKind,
  code: string,
  field = "code",
): Promise<number> {
  const existing = await tx.holder.findUnique({
    where: { siteId_kind_code: { siteId, kind, code } },
    select: { id: true },
  });
  if (existing) reject("RECORD.DUPLICATE", `${labelOf(kind)} ${code} already exists`, field);
  const holder = await tx.holder.create({ data: { siteId, kind, code }, select: { id: true } });
  return holder.id;
}

export async function requireHolder(
  tx: Tx,
  siteId: number,
  kind: HolderKind,
  code: string,
  field: string,
): Promise<{ id: number; stockG: number }> {
  const holder = await tx.holder.findUnique({
    where: { siteId_kind_code: { siteId, kind, code } },
    select: { id: true, stockG: true },
  });
  if (!holder) reject("RECORD.NOT_FOUND", `${labelOf(kind)} ${code} does not exist`, field);
  return holder;
}

export async function getStockG(tx: Tx, holderId: number): Promise<number> {
  return (await tx.holder.findUniqueOrThrow({ where: { id: holderId }, select: { stockG: true } })).stockG;
}

/** Refuses a booking dated inside a closed accounting period. */
export async function assertPeriodOpen(tx: Tx, siteId: number, at: Date, field = "at"): Promise<void> {
  await assertPeriodsOpen(tx, siteId, [{ at, field }]);
}

const CHUNK = 500; // rows per statement: under SQLite's bound-parameter limit

/**
 * Many new holders of one kind at once, each holding the mass its receipt brings (for bulk imports,
 * where every holder is new and its only movement is the receipt written by postReceipts).
 */
export async function createHoldersWithStock(
  tx: Tx,
  siteId: number,
  kind: HolderKind,
  items: ReadonlyArray<{ code: string; stockG: number; field: string }>,
): Promise<Map<string, number>> {
  const seen = new Map<string, string>();
  for (const it of items) {
    const earlier = seen.get(it.code);
    if (earlier !== undefined)
      reject("RECORD.DUPLICATE", `${labelOf(kind)} ${it.code} appears twice in this import`, it.field);
    seen.set(it.code, it.field);
  }
  const ids = new Map<string, number>();
  for (let i = 0; i < items.length; i += CHUNK) {
    const part = items.slice(i, i + CHUNK);
    const clash = await tx.holder.findFirst({
      where: { siteId, kind, code: { in: part.map((x) => x.code) } },
      select: { code: true },
    });
    if (clash)
      reject("RECORD.DUPLICATE", `${labelOf(kind)} ${clash.code} already exists`, seen.get(clash.code) ?? "code");
    await insertRows(
      tx,
      "Holder",
      ["siteId", "kind", "code", "stockG"],
      part.map((x) => [siteId, kind, x.code, x.stockG]),
    );
    const made = await tx.holder.findMany({
      where: { siteId, kind, code: { in: part.map((x) => x.code) } },
      select: { id: true, code: true },
    });
    for (const h of made) ids.set(h.code, h.id);
  }
  return ids;
}

/** Refuses any of these times that falls in a closed period, reading the closed periods once. */
export async function assertPeriodsOpen(
  tx: Tx,
  siteId: number,
  times: ReadonlyArray<{ at: Date; field: string }>,
): Promise<void> {
  if (times.length === 0) return;
  // A loop, not Math.min(...times): a large import would overflow the argument list.
  let first = Number.POSITIVE_INFINITY;
  let last = Number.NEGATIVE_INFINITY;
  for (const t of times) {
    first = Math.min(first, t.at.getTime());
    last = Math.max(last, t.at.getTime());
  }
  const closed = await tx.accountingPeriod.findMany({
    where: { siteId, status: "CLOSED", startsAt: { lte: new Date(last) }, endsAt: { gt: new Date(first) } },
    select: { startsAt: true, endsAt: true },
  });
  for (const t of times) {
    const p = closed.find((c) => c.startsAt <= t.at && t.at < c.endsAt);
    if (p)
      reject(
        "PERIOD.CLOSED",
        `The period ${p.startsAt.toISOString().slice(0, 10)} – ${p.endsAt.toISOString().slice(0, 10)} is closed; a compliance user must reopen it first`,
        t.field,
      );
  }
}

/**
 * Receipts into holders made by createHoldersWithStock (material entering the books; nothing is drawn,
 * so no guard is needed and no cycle can close). Append-only rows, written in chunks.
 */
export async function postReceipts(tx: Tx, drafts: ReadonlyArray<MovementDraft>): Promise<void> {
  await assertPeriodsOpen(
    tx,
    drafts[0]?.siteId ?? 0,
    drafts.map((d) => ({ at: d.at, field: d.field ?? "at" })),
  );
  for (const d of drafts) {
    if (d.fromHolderId !== null)
      reject("LEDGER.NOT_A_RECEIPT", "Only receipts are written in bulk", d.field ?? "massKg");
    if (!Number.isSafeInteger(d.massG) || d.massG <= 0)
      reject("LEDGER.BAD_MASS", "Mass must be more than 0 g", d.field ?? "massKg");
  }
  const recordedAt = new Date();
  await insertRows(
    tx,
    "Movement",
    [
      "siteId",
      "at",
      "role",
      "fromHolderId",
      "toHolderId",
      "massG",
      "volumeMl",
      "tempC",
      "note",
      "recordedById",
      "recordedAt",
    ],
    drafts.map((m) => [
      m.siteId,
      m.at,
      m.role,
      null,
      m.toHolderId,
      m.massG,
      m.volumeMl ?? null,
      m.tempC ?? null,
      m.note ?? "",
      m.recordedById,
      recordedAt,
    ]),
  );
}

export interface MovementDraft {
  siteId: number;
  at: Date;
  role: MoveRole;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
  volumeMl?: number | null;
  tempC?: number | null;
  note?: string;
  recordedById: number;
  /** The movement this one cancels (a correction); set only by the correction service. */
  reversesId?: number | null;
  /** The destination's capacity (tanks): the fill is refused with `refusal(stockG)` if it would not fit. */
  room?: { capacityG: number; refusal: (stockG: number) => string };
  /** Field name to blame in messages (the form's mass field). */
  field?: string;
}

export async function postMovement(tx: Tx, m: MovementDraft): Promise<number> {
  const field = m.field ?? "massKg";
  if (!Number.isSafeInteger(m.massG) || m.massG <= 0) reject("LEDGER.BAD_MASS", "Mass must be more than 0 g", field);
  if (m.fromHolderId === m.toHolderId) reject("LEDGER.SAME_HOLDER", "A movement needs two different places", field);
  await assertPeriodOpen(tx, m.siteId, m.at);
  if (m.fromHolderId !== null) {
    await assertDrawableThroughout(tx, m.fromHolderId, m.at, m.massG, field);
    const drawn = await tx.holder.updateMany({
      where: { id: m.fromHolderId, stockG: { gte: m.massG } },
      data: { stockG: { decrement: m.massG } },
    });
    if (drawn.count !== 1) {
      const from = await tx.holder.findUnique({
        where: { id: m.fromHolderId },
        select: { kind: true, code: true, stockG: true },
      });
      const held = from ? (from.stockG / 1000).toLocaleString("en", { maximumFractionDigits: 3 }) : "0";
      reject(
        "LEDGER.OVERDRAW",
        `${from ? `${labelOf(from.kind)} ${from.code}` : "The source"} holds ${held} kg; cannot draw ${(m.massG / 1000).toLocaleString("en", { maximumFractionDigits: 3 })} kg`,
        field,
      );
    }
  }
  if (m.room === undefined) {
    await tx.holder.update({ where: { id: m.toHolderId }, data: { stockG: { increment: m.massG } } });
  } else {
    // A vessel's capacity is guarded like a draw: one conditional increment, so concurrent fills
    // cannot each pass a check made on a stock the other is about to change.
    const filled = await tx.holder.updateMany({
      where: { id: m.toHolderId, stockG: { lte: m.room.capacityG - m.massG } },
      data: { stockG: { increment: m.massG } },
    });
    if (filled.count !== 1) {
      const to = await tx.holder.findUnique({ where: { id: m.toHolderId }, select: { stockG: true } });
      reject("TANK.OVERFILL", m.room.refusal(to?.stockG ?? 0), field);
    }
  }
  const row = await tx.movement.create({
    data: {
      siteId: m.siteId,
      at: m.at,
      role: m.role,
      fromHolderId: m.fromHolderId,
      toHolderId: m.toHolderId,
      massG: m.massG,
      volumeMl: m.volumeMl ?? null,
      tempC: m.tempC ?? null,
      note: m.note ?? "",
      recordedById: m.recordedById,
      reversesId: m.reversesId ?? null,
    },
    select: { id: true },
  });
  await assertNoCycle(tx, m, row.id, field);
  return row.id;
}

/**
 * A booking must not make a lot, batch or product lot its own ancestor (genealogy could not say what
 * it is made of). A cycle through the new move needs a move out of its destination after it, so a
 * booking dated now never pays more than one indexed count; a back-dated one into a holder that has
 * sent material on since is checked against the site's whole ledger (lib/ledger/cycle.ts).
 */
async function assertNoCycle(tx: Tx, m: MovementDraft, moveId: number, field: string): Promise<void> {
  // A reversal and the movement it cancels are left out of genealogy as a pair, so they close no cycle.
  if (m.fromHolderId === null || (m.reversesId ?? null) !== null) return;
  const later = await tx.movement.count({ where: { fromHolderId: m.toHolderId, at: { gt: m.at } } });
  if (later === 0) return;
  const ledger = await loadTraceLedger(tx, m.siteId);
  const newMove = {
    id: moveId,
    at: m.at.getTime(),
    fromHolderId: m.fromHolderId,
    toHolderId: m.toHolderId,
    massG: m.massG,
  };
  const holders = new Map(ledger.holders.map((h) => [h.id, h]));
  const verdict = refuseCycle(
    ledger.moves.filter((x) => x.id !== moveId),
    newMove,
    holders,
  );
  if (!verdict.ok) {
    const cycle = verdict.issues[0]?.message ?? "";
    reject(
      "LEDGER.CYCLE",
      `This movement would make a record its own ancestor — material it sent on would come back into it. Book rework as a new batch or lot. (${cycle})`,
      field,
    );
  }
}

/**
 * A back-dated draw must have been possible at its own time and must not leave the holder short at
 * any later booking: the ledger stays consistent in date order, not only in entry order. Only the
 * holder's movements after `at` are read, which for a booking made now is none.
 */
async function assertDrawableThroughout(
  tx: Tx,
  holderId: number,
  at: Date,
  massG: number,
  field: string,
): Promise<void> {
  const later = await tx.movement.findMany({
    where: { OR: [{ fromHolderId: holderId }, { toHolderId: holderId }], at: { gt: at } },
    orderBy: [{ at: "asc" }, { id: "asc" }],
    select: { fromHolderId: true, massG: true, at: true },
  });
  if (later.length === 0) return;
  const holder = await tx.holder.findUniqueOrThrow({
    where: { id: holderId },
    select: { stockG: true, kind: true, code: true },
  });
  let stock = later.reduce((s, mv) => s + (mv.fromHolderId === holderId ? mv.massG : -mv.massG), holder.stockG);
  let lowest = stock;
  let lowestAt = at;
  for (const mv of later) {
    stock += mv.fromHolderId === holderId ? -mv.massG : mv.massG;
    if (stock < lowest) {
      lowest = stock;
      lowestAt = mv.at;
    }
  }
  if (lowest < massG) {
    const kg = (g: number) => (g / 1000).toLocaleString("en", { maximumFractionDigits: 3 });
    reject(
      "LEDGER.OVERDRAW_IN_TIME",
      `${labelOf(holder.kind)} ${holder.code} held only ${kg(Math.max(0, lowest))} kg at ${lowestAt.toISOString().slice(0, 16).replace("T", " ")} UTC; a draw of ${kg(massG)} kg dated ${at.toISOString().slice(0, 16).replace("T", " ")} UTC would leave it short`,
      field,
    );
  }
}

export interface LedgerRow {
  id: number;
  at: Date;
  role: MoveRole;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
}

export async function listMovements(db: Db | Tx, siteId: number, until?: Date): Promise<LedgerRow[]> {
  const rows = await db.movement.findMany({
    where: { siteId, ...(until ? { at: { lte: until } } : {}) },
    orderBy: [{ at: "asc" }, { id: "asc" }],
    select: { id: true, at: true, role: true, fromHolderId: true, toHolderId: true, massG: true },
  });
  return rows.map((r) => ({ ...r, role: r.role as MoveRole }));
}
