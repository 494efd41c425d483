import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/database/connect";
import type { Result } from "@/lib/errors";
import { parseInput } from "@/lib/ledger/parse";
import { createHolder, getStockG, postMovement, reject, requireHolder, runInTransaction } from "@/lib/ledger/ledger.store";
import { getContainerState, insertDisposal, insertWasteContainer, setContainerStatus } from "@/lib/waste/container.store";
import { DisposalSchema, WasteContainerSchema } from "@/lib/waste/container.schema";
import { toGrams, toMillilitres } from "@/lib/quantity/units";
import type { Actor } from "@/lib/site/actor";

export async function openWasteContainer(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; code: string }>> {
  const parsed = parseInput(WasteContainerSchema, input);
  if (!parsed.ok) return parsed;
  const w = parsed.value;
  return runInTransaction(db, async (tx) => {
    const holderId = await createHolder(tx, actor.siteId, "WASTE_CONTAINER", w.code);
    const saved = await insertWasteContainer(tx, {
        siteId: actor.siteId,
        holderId,
        code: w.code,
        stream: w.stream,
        accumulationStart: w.accumulationStart,
        capacityMl: toMillilitres(w.capacityL),
        satellite: w.satellite,
        methanolPct: w.methanolPct ?? null,
        pH: w.pH ?? null,
        flashPointC: w.flashPointC ?? null,
        waterPct: w.waterPct ?? null,
    });
    await appendAudit(tx, actor, { action: "CREATE", entity: "WasteContainer", entityKey: w.code, after: w });
    return saved;
  });
}

/** A hauler collects from a container under a manifest; an emptied container is marked hauled away. */
export async function recordDisposal(db: Db, actor: Actor, input: unknown): Promise<Result<{ id: number; documentNo: string }>> {
  const parsed = parseInput(DisposalSchema, input);
  if (!parsed.ok) return parsed;
  const d = parsed.value;
  return runInTransaction(db, async (tx) => {
    const from = await requireHolder(tx, actor.siteId, "WASTE_CONTAINER", d.containerCode, "containerCode");
    const container = await getContainerState(tx, from.id);
    if (d.disposedAt < container.accumulationStart) reject("WASTE.BEFORE_START", "Collected time is before the container started filling", "disposedAt");
    const holderId = await createHolder(tx, actor.siteId, "DISPOSAL", d.documentNo);
    const massG = toGrams(d.massKg);
    const disposal = await insertDisposal(tx, { siteId: actor.siteId, holderId, hauler: d.hauler, documentNo: d.documentNo, disposedAt: d.disposedAt, massG });
    await postMovement(tx, { siteId: actor.siteId, at: d.disposedAt, role: "DISPOSAL", fromHolderId: from.id, toHolderId: holderId, massG, recordedById: actor.userId, note: `hauled by ${d.hauler}` });
    if ((await getStockG(tx, from.id)) === 0) await setContainerStatus(tx, container.id, "SHIPPED");
    await appendAudit(tx, actor, { action: "CREATE", entity: "Disposal", entityKey: d.documentNo, after: { ...d, massG } });
    return disposal;
  });
}
