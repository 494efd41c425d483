// Feedstock entering the books per week, by material kind, for the stacked picture on the lots page.
// A receipt is what the period balance counts as feedstock received: a movement from outside the books
// into a pickup, a delivery, a lot or a tank (pickups collected, deliveries received, receiving
// differences above the pickup estimates). Weeks start on Monday, 00:00 site time. Pure.

export interface FeedstockReceipt {
  at: number;
  massG: number;
  /** Material kind of the holder the receipt went into (a tank pools kinds: "MIXED_FEEDSTOCK"). */
  material: string;
}

export interface ReceiptWeek {
  /** Monday of the week, site date "YYYY-MM-DD". */
  weekOf: string;
  startMs: number;
  byMaterial: Record<string, number>;
  totalG: number;
}

export interface ReceiptsSeries {
  weeks: ReceiptWeek[];
  /** Material kinds present, most received first. */
  materials: string[];
  totalsByMaterial: Record<string, number>;
  totalG: number;
}

const DAY_MS = 86_400_000;
const WEEK_MS = 7 * DAY_MS;

/** The start (UTC instant) of the site week holding `at`; 1970-01-01 was a Thursday, three days after a Monday. */
export function weekStartMs(at: number, utcOffsetMin: number): number {
  const offsetMs = utcOffsetMin * 60_000;
  const localDay = Math.floor((at + offsetMs) / DAY_MS);
  const sinceMonday = (((localDay + 3) % 7) + 7) % 7;
  return (localDay - sinceMonday) * DAY_MS - offsetMs;
}

function siteDate(startMs: number, utcOffsetMin: number): string {
  return new Date(startMs + utcOffsetMin * 60_000).toISOString().slice(0, 10);
}

/**
 * Every week that overlaps [startMs, endMs), empty weeks included so the axis keeps its rhythm; receipts
 * outside the range are left out.
 */
export function computeReceiptsSeries(
  receipts: readonly FeedstockReceipt[],
  range: { startMs: number; endMs: number },
  utcOffsetMin: number,
): ReceiptsSeries {
  const weeks: ReceiptWeek[] = [];
  const index = new Map<number, ReceiptWeek>();
  if (range.endMs > range.startMs) {
    for (let w = weekStartMs(range.startMs, utcOffsetMin); w < range.endMs; w += WEEK_MS) {
      const week: ReceiptWeek = { weekOf: siteDate(w, utcOffsetMin), startMs: w, byMaterial: {}, totalG: 0 };
      weeks.push(week);
      index.set(w, week);
    }
  }
  const totalsByMaterial: Record<string, number> = {};
  let totalG = 0;
  for (const r of receipts) {
    if (r.at < range.startMs || r.at >= range.endMs) continue;
    const week = index.get(weekStartMs(r.at, utcOffsetMin));
    if (!week) continue;
    week.byMaterial[r.material] = (week.byMaterial[r.material] ?? 0) + r.massG;
    week.totalG += r.massG;
    totalsByMaterial[r.material] = (totalsByMaterial[r.material] ?? 0) + r.massG;
    totalG += r.massG;
  }
  const materials = Object.keys(totalsByMaterial).sort(
    (a, b) => (totalsByMaterial[b] ?? 0) - (totalsByMaterial[a] ?? 0) || a.localeCompare(b),
  );
  return { weeks, materials, totalsByMaterial, totalG };
}
