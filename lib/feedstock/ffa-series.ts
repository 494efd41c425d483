// The FFA of the lots each source supplied, over time, for the picture on the source page. A lot made
// of pooled pickups counts under every source that had a pickup in it; a delivered lot under its
// supplier. A lot's FFA is the mean of its titrations not voided, as the lots list shows it; a lot not yet titrated is left
// out of the points and counted apart. Pure.

export interface FfaTitration {
  testedAt: number;
  ffaPct: number;
  voided: boolean;
}

export interface FfaLot {
  code: string;
  receivedAt: number;
  material: string;
  massG: number;
  /** Codes of the sources whose material is in the lot. */
  sourceCodes: readonly string[];
  titrations: readonly FfaTitration[];
}

export interface FfaPoint {
  lotCode: string;
  at: number;
  ffaPct: number;
  massG: number;
  material: string;
}

export interface SourceFfaSeries {
  sourceCode: string;
  /** Oldest lot first. */
  points: FfaPoint[];
  untested: number;
  minPct: number | null;
  maxPct: number | null;
  /** Σ(FFA × mass) ÷ Σ mass: FFA is a mass fraction, so lots pooled together would have this FFA. */
  massWeightedPct: number | null;
}

/** The mean FFA of the titrations not voided (replicates are averaged), or null when there is none. */
export function lotFfa(titrations: readonly FfaTitration[]): number | null {
  const valid = titrations.filter((t) => !t.voided);
  return valid.length === 0 ? null : valid.reduce((s, t) => s + t.ffaPct, 0) / valid.length;
}

function summarise(sourceCode: string, points: FfaPoint[], untested: number): SourceFfaSeries {
  points.sort((a, b) => a.at - b.at || a.lotCode.localeCompare(b.lotCode));
  const mass = points.reduce((s, p) => s + p.massG, 0);
  return {
    sourceCode,
    points,
    untested,
    minPct: points.length ? Math.min(...points.map((p) => p.ffaPct)) : null,
    maxPct: points.length ? Math.max(...points.map((p) => p.ffaPct)) : null,
    massWeightedPct: mass > 0 ? points.reduce((s, p) => s + p.ffaPct * p.massG, 0) / mass : null,
  };
}

/** One series per source that supplied any lot, sorted by source code. */
export function computeFfaBySource(lots: readonly FfaLot[]): SourceFfaSeries[] {
  const points = new Map<string, FfaPoint[]>();
  const untested = new Map<string, number>();
  for (const lot of lots) {
    const ffa = lotFfa(lot.titrations);
    for (const code of new Set(lot.sourceCodes)) {
      if (!points.has(code)) points.set(code, []);
      if (ffa === null) untested.set(code, (untested.get(code) ?? 0) + 1);
      else
        points
          .get(code)
          ?.push({ lotCode: lot.code, at: lot.receivedAt, ffaPct: ffa, massG: lot.massG, material: lot.material });
    }
  }
  return [...points.keys()].sort().map((code) => summarise(code, points.get(code) ?? [], untested.get(code) ?? 0));
}
