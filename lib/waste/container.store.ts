import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import type { WasteContainerRow } from "@/lib/waste/container-row";
import { toContainerRow } from "@/lib/waste/container-row";
// Waste containers and disposals: the lists, one container's history, and the writes of the container
// service. Due dates of the containers on site are read in due-board.store.ts (re-exported here).

export { getWasteDueBoard, loadWasteDueInputs } from "@/lib/waste/due-board.store";
export type { WasteDueBoard, WasteDueRow, WasteDueAssumption } from "@/lib/waste/due-board";
export { ASSUMPTION_NOTE } from "@/lib/waste/due-board";
export type { WasteContainerRow } from "@/lib/waste/container-row";

/** Containers by accumulation start, oldest first; `statuses` narrows to e.g. those still on site. */
export async function listWasteContainers(
  db: Db,
  siteId: number,
  opts: { statuses?: readonly string[] } = {},
): Promise<WasteContainerRow[]> {
  const rows = await db.wasteContainer.findMany({
    where: { siteId, ...(opts.statuses ? { status: { in: [...opts.statuses] } } : {}) },
    orderBy: [{ accumulationStart: "asc" }, { id: "asc" }],
    include: { holder: { select: { stockG: true } } },
  });
  return rows.map(toContainerRow);
}

export interface ContainerMovement {
  id: number;
  at: Date;
  role: string;
  direction: "IN" | "OUT";
  massG: number;
  /** The other end: where it came from (in) or went to (out); null for a receipt. */
  otherKind: string | null;
  otherCode: string | null;
  note: string;
}

export interface DisposalOfContainer {
  documentNo: string;
  hauler: string;
  destination: string;
  disposedAt: Date;
  massG: number;
}

export interface WasteContainerDetail extends WasteContainerRow {
  movements: ContainerMovement[];
  disposals: DisposalOfContainer[];
}

/** One container with its movements in and out (oldest first) and the hauls that took from it. */
export async function getWasteContainerDetail(
  db: Db,
  siteId: number,
  code: string,
): Promise<WasteContainerDetail | null> {
  const r = await db.wasteContainer.findUnique({
    where: { siteId_code: { siteId, code } },
    include: {
      holder: {
        select: {
          stockG: true,
          incoming: {
            orderBy: [{ at: "asc" }, { id: "asc" }],
            select: {
              id: true,
              at: true,
              role: true,
              massG: true,
              note: true,
              fromHolder: { select: { kind: true, code: true } },
            },
          },
          outgoing: {
            orderBy: [{ at: "asc" }, { id: "asc" }],
            select: {
              id: true,
              at: true,
              role: true,
              massG: true,
              note: true,
              toHolder: { select: { kind: true, code: true } },
            },
          },
        },
      },
    },
  });
  if (!r) return null;
  const movements: ContainerMovement[] = [
    ...r.holder.incoming.map((m) => ({
      id: m.id,
      at: m.at,
      role: m.role,
      direction: "IN" as const,
      massG: m.massG,
      otherKind: m.fromHolder?.kind ?? null,
      otherCode: m.fromHolder?.code ?? null,
      note: m.note,
    })),
    ...r.holder.outgoing.map((m) => ({
      id: m.id,
      at: m.at,
      role: m.role,
      direction: "OUT" as const,
      massG: m.massG,
      otherKind: m.toHolder.kind,
      otherCode: m.toHolder.code,
      note: m.note,
    })),
  ].sort((a, b) => a.at.getTime() - b.at.getTime() || a.id - b.id);
  const hauledTo = r.holder.outgoing.filter((m) => m.toHolder.kind === "DISPOSAL").map((m) => m.toHolder.code);
  const disposals =
    hauledTo.length === 0
      ? []
      : await db.disposal.findMany({
          where: { siteId, documentNo: { in: hauledTo } },
          orderBy: [{ disposedAt: "asc" }, { id: "asc" }],
          select: { documentNo: true, hauler: true, destination: true, disposedAt: true, massG: true },
        });
  return { ...toContainerRow(r), movements, disposals };
}

export interface DisposalRow {
  documentNo: string;
  hauler: string;
  destination: string;
  disposedAt: Date;
  massG: number;
  /** Containers it was collected from (the sources of its incoming movements). */
  containerCodes: string[];
}

export async function listDisposals(db: Db, siteId: number): Promise<DisposalRow[]> {
  const rows = await db.disposal.findMany({
    where: { siteId },
    orderBy: [{ disposedAt: "desc" }, { id: "desc" }],
    include: {
      holder: { select: { incoming: { orderBy: { id: "asc" }, select: { fromHolder: { select: { code: true } } } } } },
    },
  });
  return rows.map((r) => ({
    documentNo: r.documentNo,
    hauler: r.hauler,
    destination: r.destination,
    disposedAt: r.disposedAt,
    massG: r.massG,
    containerCodes: [...new Set(r.holder.incoming.flatMap((m) => (m.fromHolder ? [m.fromHolder.code] : [])))],
  }));
}

// ---- writes used by lib/waste/container.service.ts and lib/batch/batch.service.ts

export async function insertWasteContainer(
  tx: Tx,
  w: {
    siteId: number;
    holderId: number;
    code: string;
    stream: string;
    location: string;
    accumulationStart: Date;
    capacityMl: number;
    satellite: boolean;
    methanolPct: number | null;
    pH: number | null;
    flashPointC: number | null;
    waterPct: number | null;
    characterisedAt: Date | null;
  },
): Promise<{ id: number; code: string }> {
  return tx.wasteContainer.create({ data: { ...w, status: "OPEN" }, select: { id: true, code: true } });
}

export interface ContainerState {
  id: number;
  code: string;
  status: string;
  accumulationStart: Date;
  methanolPct: number | null;
  pH: number | null;
  flashPointC: number | null;
  waterPct: number | null;
  characterisedAt: Date | null;
  fullAt: Date | null;
}

export async function getContainerState(tx: Tx, holderId: number): Promise<ContainerState> {
  return tx.wasteContainer.findUniqueOrThrow({
    where: { holderId },
    select: {
      id: true,
      code: true,
      status: true,
      accumulationStart: true,
      methanolPct: true,
      pH: true,
      flashPointC: true,
      waterPct: true,
      characterisedAt: true,
      fullAt: true,
    },
  });
}

export async function insertDisposal(
  tx: Tx,
  d: {
    siteId: number;
    holderId: number;
    hauler: string;
    documentNo: string;
    disposedAt: Date;
    massG: number;
    destination: string;
    containerCode: string;
  },
): Promise<{ id: number; documentNo: string }> {
  return tx.disposal.create({ data: d, select: { id: true, documentNo: true } });
}

export async function disposalExists(tx: Tx, siteId: number, documentNo: string): Promise<boolean> {
  return (await tx.disposal.count({ where: { siteId, documentNo } })) > 0;
}

export async function setContainerStatus(tx: Tx, id: number, status: string): Promise<void> {
  await tx.wasteContainer.update({ where: { id }, data: { status } });
}

/** The new characterisation replaces the stored values (a value not measured this time is cleared). */
export async function setCharacterisation(
  tx: Tx,
  id: number,
  c: {
    methanolPct: number | null;
    pH: number | null;
    flashPointC: number | null;
    waterPct: number | null;
    characterisedAt: Date;
  },
): Promise<void> {
  await tx.wasteContainer.update({ where: { id }, data: c });
}

/** Marks an open container full with one conditional update, so two clerks cannot both mark it. */
export async function markFullIfOpen(tx: Tx, id: number, fullAt: Date): Promise<boolean> {
  const r = await tx.wasteContainer.updateMany({ where: { id, status: "OPEN" }, data: { status: "FULL", fullAt } });
  return r.count === 1;
}
