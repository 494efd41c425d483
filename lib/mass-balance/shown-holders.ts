// Which holders a period's statement can show, out of those a read returned: the ones it names (held
// stock at the period start, gauged, moved in the period) and every batch not finished before the
// period (still running, finished since, or without a batch record). Pure.

/**
 * The ids to keep. A read that named holders by their movements' window may return a few more than
 * the movements read describes (a movement committed between the two reads); those are left out.
 */
export function shownHolderIds(
  holders: ReadonlyArray<{ id: number; kind: string }>,
  batches: ReadonlyArray<{ holderId: number; completedAt: Date | null }>,
  named: ReadonlySet<number>,
  sinceMs: number,
): Set<number> {
  const done = new Map(batches.map((b) => [b.holderId, b.completedAt]));
  const keep = new Set<number>();
  for (const h of holders) {
    const completedAt = done.get(h.id) ?? null;
    if (named.has(h.id) || (h.kind === "BATCH" && (completedAt === null || completedAt.getTime() >= sinceMs)))
      keep.add(h.id);
  }
  return keep;
}
