// A tank's book stock over time for its picture: the running sum of every movement into and out of
// the tank (a step line), the gauge readings beside it, and the capacity at the nominal density.
// Pure: the caller passes the tank's movements, readings and capacity in.

export interface TankMove {
  at: number;
  /** Positive grams; the direction says whether it entered or left the tank. */
  massG: number;
  direction: "IN" | "OUT";
}

export interface TankReading {
  at: number;
  massG: number;
}

export interface StockPoint {
  at: number;
  stockG: number;
}

export interface TankStockSeries {
  /** Book stock just after each instant with movements, from empty before the first one. */
  book: StockPoint[];
  gauges: StockPoint[];
  capacityG: number;
  inG: number;
  outG: number;
  /** inG − outG: the tank's book stock now. */
  closingG: number;
  /** The highest book stock reached, grams. */
  peakG: number;
}

/** Movements at one instant are summed into one step, so a step line shows no zero-width spikes. */
export function computeTankStockSeries(
  moves: readonly TankMove[],
  readings: readonly TankReading[],
  capacityG: number,
): TankStockSeries {
  const byInstant = new Map<number, number>();
  let inG = 0;
  let outG = 0;
  for (const m of moves) {
    const signed = m.direction === "IN" ? m.massG : -m.massG;
    if (m.direction === "IN") inG += m.massG;
    else outG += m.massG;
    byInstant.set(m.at, (byInstant.get(m.at) ?? 0) + signed);
  }
  const instants = [...byInstant.keys()].sort((a, b) => a - b);
  const book: StockPoint[] = [];
  let stock = 0;
  let peakG = 0;
  if (instants.length > 0) book.push({ at: instants[0] as number, stockG: 0 });
  for (const at of instants) {
    stock += byInstant.get(at) ?? 0;
    peakG = Math.max(peakG, stock);
    book.push({ at, stockG: stock });
  }
  const gauges = [...readings].sort((a, b) => a.at - b.at).map((r) => ({ at: r.at, stockG: r.massG }));
  return { book, gauges, capacityG, inG, outG, closingG: inG - outG, peakG };
}
