// The monthly snapshots built on a worker thread (lib/trace/snapshot-worker.service.ts) are exactly the
// ones built inline, from the ledger start and from a stored snapshot part-way, in date order and in
// booking order; and a trace resumed from either gives the same answer.
import { describe, expect, it } from "vitest";
import { generatePlantHistory } from "@/bench/plant-history";
import { indexLedger } from "@/lib/ledger/moves";
import { traceHolder } from "@/lib/trace/genealogy";
import { extendSnapshots } from "@/lib/trace/monthly-snapshots";
import { extendSnapshotsOffThread } from "@/lib/trace/snapshot-worker.service";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

describe("snapshots built on a worker thread", () => {
  const h = generatePlantHistory({ years: 1 });
  const realAt = new Map(h.moves.map((m) => [m.id, m.at]));

  it.each(["dated", "booked"] as const)(
    "equal the inline ones in %s order, from the start and from part-way",
    async (order) => {
      const moves = order === "dated" ? h.moves : h.moves.map((m) => ({ ...m, at: m.id }));
      const index = value(indexLedger(h.holders, moves));
      const inline = value(extendSnapshots(index, [], realAt));
      expect(inline.length).toBeGreaterThan(10);
      const worker = value(await extendSnapshotsOffThread(index, [], realAt, { force: true }));
      expect(worker).toEqual(inline);
      const kept = inline.slice(0, 4);
      const resumedInline = value(extendSnapshots(index, kept, realAt));
      const resumedWorker = value(await extendSnapshotsOffThread(index, kept, realAt, { force: true }));
      expect(resumedWorker).toEqual(resumedInline);
      expect(resumedWorker.slice(0, 4)).toEqual(kept);
      const last = worker[worker.length - 1];
      const probe = h.probes.lateProductLotHolderId;
      expect(value(traceHolder(index, probe, last ? { from: last } : {}))).toEqual(
        value(traceHolder(index, probe, inline[inline.length - 1] ? { from: inline[inline.length - 1] } : {})),
      );
    },
    120_000,
  );
});
