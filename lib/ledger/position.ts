// Answers kept by the ledger position they were computed at. Pure: the caller reads the position (see
// position.store.ts) and passes it in; nothing here reads the clock or the database.

/** Where a site's books stood: the last movement id and the audit chain's sequence number. */
export interface LedgerPosition {
  siteId: number;
  moveId: number;
  auditSeq: number;
}

export function samePosition(a: LedgerPosition, b: LedgerPosition): boolean {
  return a.siteId === b.siteId && a.moveId === b.moveId && a.auditSeq === b.auditSeq;
}

export function positionTag(p: LedgerPosition): string {
  return `${p.siteId}.${p.moveId}.${p.auditSeq}`;
}

/**
 * The quarter-hour `now` falls in (UTC). Answers whose defaults depend on the date (the balance's
 * "last month", the days left before a waste container is due) key on it as well; every time zone's
 * offset is a multiple of 15 minutes, so a local midnight always starts a new bucket.
 */
export function quarterHourOf(now: Date): number {
  return Math.floor(now.getTime() / 900_000);
}

interface Entry<T> {
  position: LedgerPosition;
  /** Kept across positions: a closed period's answer, checked by its seal instead of the position. */
  seal: string | null;
  value: T;
}

/**
 * A bounded map from a question (site, query, role, time bucket) to the answer computed at a ledger
 * position. `get` hands back an answer only for the same position, or, for a sealed answer, the same
 * seal; anything else is a miss and the caller computes again. The oldest question is dropped first.
 */
export class PositionCache<T> {
  private readonly entries = new Map<string, Entry<T>>();

  constructor(private readonly maxEntries: number) {}

  get size(): number {
    return this.entries.size;
  }

  /** The answer kept for this question at this position, if any. */
  get(key: string, position: LedgerPosition): T | undefined {
    const e = this.entries.get(key);
    if (e === undefined || !samePosition(e.position, position)) return undefined;
    this.touch(key, e);
    return e.value;
  }

  /** A sealed answer (e.g. a closed period's) and its seal, whatever the position now is. */
  getSealed(key: string): { seal: string; value: T } | undefined {
    const e = this.entries.get(key);
    if (e === undefined || e.seal === null) return undefined;
    this.touch(key, e);
    return { seal: e.seal, value: e.value };
  }

  set(key: string, position: LedgerPosition, value: T, seal: string | null = null): void {
    this.entries.delete(key);
    this.entries.set(key, { position, seal, value });
    while (this.entries.size > this.maxEntries) {
      const oldest = this.entries.keys().next().value;
      if (oldest === undefined) break;
      this.entries.delete(oldest);
    }
  }

  clear(): void {
    this.entries.clear();
  }

  private touch(key: string, e: Entry<T>): void {
    this.entries.delete(key);
    this.entries.set(key, e);
  }
}
