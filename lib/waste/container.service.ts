import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { assertPeriodsOpen, createHolder, getStockG, postMovement, requireHolder } from "@/lib/ledger/ledger.store";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import type { Tx } from "@/lib/core/connect";
import {
  disposalExists,
  getContainerState,
  insertDisposal,
  insertWasteContainer,
  markFullIfOpen,
  setCharacterisation,
  setContainerStatus,
} from "@/lib/waste/container.store";
import type { ContainerState } from "@/lib/waste/container.store";
import {
  DisposalSchema,
  MarkContainerFullSchema,
  WasteCharacterisationEntrySchema,
  WasteContainerSchema,
} from "@/lib/waste/container.schema";
import { checkCharacterise, checkHaul, checkMarkFull } from "@/lib/waste/container-rules";
import type { DomainIssue } from "@/lib/core/result";
import { toGrams, toMillilitres } from "@/lib/quantity/units";
import type { Actor } from "@/lib/core/actor";

function refuse(issue: DomainIssue | null): void {
  if (issue) reject(issue.code, issue.message, issue.field);
}

async function requireContainer(
  tx: Tx,
  siteId: number,
  code: string,
): Promise<{ holderId: number; stockG: number; state: ContainerState }> {
  const holder = await requireHolder(tx, siteId, "WASTE_CONTAINER", code, "containerCode");
  return { holderId: holder.id, stockG: holder.stockG, state: await getContainerState(tx, holder.id) };
}

export async function openWasteContainer(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ id: number; code: string }>> {
  const parsed = parseInput(WasteContainerSchema, input);
  if (!parsed.ok) return parsed;
  const w = parsed.value;
  const measured =
    w.methanolPct !== undefined || w.pH !== undefined || w.flashPointC !== undefined || w.waterPct !== undefined;
  return runInTransaction(db, async (tx) => {
    await assertPeriodsOpen(tx, actor.siteId, [{ at: w.accumulationStart, field: "accumulationStart" }]);
    const holderId = await createHolder(tx, actor.siteId, "WASTE_CONTAINER", w.code);
    const saved = await insertWasteContainer(tx, {
      siteId: actor.siteId,
      holderId,
      code: w.code,
      stream: w.stream,
      location: w.location,
      accumulationStart: w.accumulationStart,
      capacityMl: toMillilitres(w.capacityL),
      satellite: w.satellite,
      methanolPct: w.methanolPct ?? null,
      pH: w.pH ?? null,
      flashPointC: w.flashPointC ?? null,
      waterPct: w.waterPct ?? null,
      characterisedAt: measured ? w.accumulationStart : null,
    });
    await appendAudit(tx, actor, { action: "CREATE", entity: "WasteContainer", entityKey: w.code, after: w });
    return saved;
  });
}

/** Lab results for a container's contents; the hazard assessment and due dates use them at once. */
export async function recordCharacterisation(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; characterisedAt: Date }>> {
  const parsed = parseInput(WasteCharacterisationEntrySchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    const { state } = await requireContainer(tx, actor.siteId, c.containerCode);
    refuse(checkCharacterise(state, c.testedAt));
    await assertPeriodsOpen(tx, actor.siteId, [{ at: c.testedAt, field: "testedAt" }]);
    const after = {
      methanolPct: c.methanolPct ?? null,
      pH: c.pH ?? null,
      flashPointC: c.flashPointC ?? null,
      waterPct: c.waterPct ?? null,
      characterisedAt: c.testedAt,
    };
    await setCharacterisation(tx, state.id, after);
    const before = {
      methanolPct: state.methanolPct,
      pH: state.pH,
      flashPointC: state.flashPointC,
      waterPct: state.waterPct,
      characterisedAt: state.characterisedAt,
    };
    await appendAudit(tx, actor, { action: "CHANGE", entity: "WasteContainer", entityKey: state.code, before, after });
    return { code: state.code, characterisedAt: c.testedAt };
  });
}

/** A container that can take no more: it stops accepting batch outputs and waits for the hauler. */
export async function markContainerFull(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; fullAt: Date }>> {
  const parsed = parseInput(MarkContainerFullSchema, input);
  if (!parsed.ok) return parsed;
  const f = parsed.value;
  return runInTransaction(db, async (tx) => {
    const { state } = await requireContainer(tx, actor.siteId, f.containerCode);
    refuse(checkMarkFull(state, f.fullAt));
    await assertPeriodsOpen(tx, actor.siteId, [{ at: f.fullAt, field: "fullAt" }]);
    if (!(await markFullIfOpen(tx, state.id, f.fullAt)))
      reject("WASTE.ALREADY_FULL", `Container ${state.code} is no longer filling`, "containerCode");
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "WasteContainer",
      entityKey: state.code,
      before: { status: state.status, fullAt: null },
      after: { status: "FULL", fullAt: f.fullAt },
    });
    return { code: state.code, fullAt: f.fullAt };
  });
}

/** A hauler collects from a container under a manifest; an emptied container is marked hauled away. */
export async function recordDisposal(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ id: number; documentNo: string; containerCode: string; emptied: boolean }>> {
  const parsed = parseInput(DisposalSchema, input);
  if (!parsed.ok) return parsed;
  const d = parsed.value;
  const massG = toGrams(d.massKg);
  return runInTransaction(db, async (tx) => {
    const { holderId: fromId, stockG, state } = await requireContainer(tx, actor.siteId, d.containerCode);
    refuse(checkHaul({ ...state, stockG }, { massG, disposedAt: d.disposedAt }));
    if (await disposalExists(tx, actor.siteId, d.documentNo))
      reject("RECORD.DUPLICATE", `Manifest or document ${d.documentNo} is already recorded`, "documentNo");
    const holderId = await createHolder(tx, actor.siteId, "DISPOSAL", d.documentNo, "documentNo");
    const disposal = await insertDisposal(tx, {
      siteId: actor.siteId,
      holderId,
      hauler: d.hauler,
      documentNo: d.documentNo,
      disposedAt: d.disposedAt,
      massG,
      destination: d.destination,
      containerCode: state.code,
    });
    await postMovement(tx, {
      siteId: actor.siteId,
      at: d.disposedAt,
      role: "DISPOSAL",
      fromHolderId: fromId,
      toHolderId: holderId,
      massG,
      recordedById: actor.userId,
      note: `hauled by ${d.hauler} to ${d.destination}`,
    });
    const emptied = (await getStockG(tx, fromId)) === 0;
    if (emptied) await setContainerStatus(tx, state.id, "SHIPPED");
    await appendAudit(tx, actor, {
      action: "CREATE",
      entity: "Disposal",
      entityKey: d.documentNo,
      after: { ...d, massG },
    });
    if (emptied)
      await appendAudit(tx, actor, {
        action: "CHANGE",
        entity: "WasteContainer",
        entityKey: state.code,
        before: { status: state.status },
        after: { status: "SHIPPED", documentNo: d.documentNo },
      });
    return { id: disposal.id, documentNo: disposal.documentNo, containerCode: state.code, emptied };
  });
}
