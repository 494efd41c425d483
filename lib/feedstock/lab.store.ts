import "server-only";
import type { Db } from "@/lib/database/connect";

export interface LotLabResult {
  lotId: number;
  /** Mean of the lot's valid titrations; null when it has none. */
  ffaPct: number | null;
  titrations: number;
  /** Latest valid water test; null when it has none. */
  waterPct: number | null;
}

const CHUNK = 500;

/** FFA (mean of valid titrations) and water (latest valid test) per lot, for the given lot ids. */
export async function getLabResults(db: Db, lotIds: readonly number[]): Promise<Map<number, LotLabResult>> {
  const out = new Map<number, LotLabResult>();
  for (const id of lotIds) out.set(id, { lotId: id, ffaPct: null, titrations: 0, waterPct: null });
  // Chunked so a tank that goes back to many lots stays under SQLite's bound-parameter limit.
  for (let i = 0; i < lotIds.length; i += CHUNK) {
    const ids = lotIds.slice(i, i + CHUNK);
    const [titrations, water] = await Promise.all([
      db.titration.findMany({ where: { lotId: { in: [...ids] }, voided: false }, select: { lotId: true, ffaPct: true } }),
      db.labTest.findMany({
        where: { lotId: { in: [...ids] }, voided: false, kind: "WATER" },
        orderBy: [{ testedAt: "desc" }, { id: "desc" }],
        select: { lotId: true, valuePct: true },
      }),
    ]);
    const sums = new Map<number, { n: number; sum: number }>();
    for (const t of titrations) {
      const s = sums.get(t.lotId) ?? { n: 0, sum: 0 };
      s.n += 1;
      s.sum += t.ffaPct;
      sums.set(t.lotId, s);
    }
    for (const [lotId, s] of sums) {
      const r = out.get(lotId);
      if (r) Object.assign(r, { ffaPct: s.sum / s.n, titrations: s.n });
    }
    for (const w of water) {
      const r = out.get(w.lotId);
      if (r && r.waterPct === null) r.waterPct = w.valuePct;
    }
  }
  return out;
}
