import "server-only";
import type { Db } from "@/lib/core/connect";
import { toFfaBasis } from "@/lib/titration/titration";
import { combineFfaReadings } from "@/lib/titration/replicates";
import type { FfaBasis } from "@/lib/titration/titration";
import type { FfaReading } from "@/lib/titration/replicates";

export interface LotLabResult {
  lotId: number;
  /** Mean of the lot's valid titrations, as ffaBasis (each converted through its acid value); null when none. */
  ffaPct: number | null;
  ffaBasis: FfaBasis;
  /** The same mean as acid value, mg KOH/g; null when none. */
  acidValue: number | null;
  titrations: number;
  /** Latest valid water test; null when it has none. */
  waterPct: number | null;
}

const CHUNK = 500;

/** FFA (mean of valid titrations) and water (latest valid test) per lot, for the given lot ids. */
export async function getLabResults(db: Db, lotIds: readonly number[]): Promise<Map<number, LotLabResult>> {
  const out = new Map<number, LotLabResult>();
  for (const id of lotIds)
    out.set(id, { lotId: id, ffaPct: null, ffaBasis: "OLEIC", acidValue: null, titrations: 0, waterPct: null });
  // Chunked so a tank that goes back to many lots stays under SQLite's bound-parameter limit.
  for (let i = 0; i < lotIds.length; i += CHUNK) {
    const ids = lotIds.slice(i, i + CHUNK);
    const [titrations, water] = await Promise.all([
      db.titration.findMany({
        where: { lotId: { in: [...ids] }, voided: false },
        select: { lotId: true, ffaPct: true, basis: true, acidValue: true },
      }),
      db.labTest.findMany({
        where: { lotId: { in: [...ids] }, voided: false, kind: "WATER" },
        orderBy: [{ testedAt: "desc" }, { id: "desc" }],
        select: { lotId: true, valuePct: true },
      }),
    ]);
    const readings = new Map<number, FfaReading[]>();
    for (const t of titrations) {
      const list = readings.get(t.lotId) ?? [];
      list.push({ ffaPct: t.ffaPct, basis: toFfaBasis(t.basis), acidValueMgKohG: t.acidValue });
      readings.set(t.lotId, list);
    }
    for (const [lotId, list] of readings) {
      const r = out.get(lotId);
      const mean = combineFfaReadings(list);
      if (r && mean.ok)
        Object.assign(r, {
          ffaPct: mean.value.ffaPct,
          ffaBasis: mean.value.basis,
          acidValue: mean.value.acidValueMgKohG,
          titrations: mean.value.n,
        });
    }
    for (const w of water) {
      const r = out.get(w.lotId);
      if (r && r.waterPct === null) r.waterPct = w.valuePct;
    }
  }
  return out;
}
