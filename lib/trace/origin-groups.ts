import type { TraceComposition } from "@/lib/trace/genealogy";

/** What the caller knows about an origin; the trace core itself knows only entry-move ids. */
export interface OriginInfo {
  lotId?: number | null;
  pickupId?: number | null;
  sourceId?: number | null;
  materialKind?: string | null;
  certified?: boolean | null;
}

export type OriginField = keyof OriginInfo;
export type OriginKey = string | number | boolean | null;

export interface OriginGroup {
  /** null when the lookup has no value for the origin. */
  key: OriginKey;
  grams: number;
  /** Percent of the trace's total. */
  pct: number;
  originIds: number[];
}

export interface FeedstockComposition extends TraceComposition {
  /** Grams of the traced quantity that are not feedstock (methanol, catalyst, …). */
  excludedG: number;
}

/**
 * Aggregates a trace by a metadata field (e.g. "sourceId", "certified") or by any function of the
 * metadata. Group grams are sums of integer origin grams, so they add up to the trace total exactly.
 */
export function groupOrigins(
  trace: TraceComposition,
  lookup: (originId: number) => OriginInfo | undefined,
  by: OriginField | ((info: OriginInfo | undefined, originId: number) => OriginKey),
): OriginGroup[] {
  const keyOf = typeof by === "function" ? by : (info: OriginInfo | undefined) => info?.[by] ?? null;
  const groups = new Map<OriginKey, OriginGroup>();
  for (const o of trace.origins) {
    const key = keyOf(lookup(o.originId), o.originId);
    const group = groups.get(key) ?? { key, grams: 0, pct: 0, originIds: [] };
    group.grams += o.grams;
    group.originIds.push(o.originId);
    groups.set(key, group);
  }
  return [...groups.values()]
    .map((g) => ({
      ...g,
      pct: trace.totalG === 0 ? 0 : (g.grams * 100) / trace.totalG,
      originIds: [...g.originIds].sort((a, b) => a - b),
    }))
    .sort((a, b) => b.grams - a.grams || String(a.key).localeCompare(String(b.key)));
}

/** Keeps only feedstock origins (the caller says which) and renormalises % over the feedstock grams. */
export function restrictToFeedstock(
  trace: TraceComposition,
  isFeedstock: (originId: number) => boolean,
): FeedstockComposition {
  const kept = trace.origins.filter((o) => isFeedstock(o.originId));
  const totalG = kept.reduce((s, o) => s + o.grams, 0);
  return {
    totalG,
    excludedG: trace.totalG - totalG,
    origins: kept.map((o) => ({ ...o, pct: totalG === 0 ? 0 : (o.grams * 100) / totalG })),
  };
}
