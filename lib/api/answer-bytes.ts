// Answers already written out, kept by the ETag they were sent with. A tag names the site's ledger
// position, the quarter-hour, the reader's role and the address asked for (etag.service.ts), so the same
// tag means the same answer: a second reader asking the same question while the books stand gets the
// bytes the first one got, without computing or serialising again (a shipment's trace is megabytes).
// Bounded by total bytes; the question asked least recently goes first. Pure: no clock, no database.

export class AnswerBytes {
  private readonly entries = new Map<string, Uint8Array>();
  private total = 0;

  /**
   * @param maxBytes all kept answers together
   * @param maxEntryBytes a larger answer is sent but not kept
   */
  constructor(
    private readonly maxBytes: number,
    private readonly maxEntryBytes: number = Math.floor(maxBytes / 4),
  ) {}

  get bytes(): number {
    return this.total;
  }

  get size(): number {
    return this.entries.size;
  }

  get(tag: string): Uint8Array | undefined {
    const body = this.entries.get(tag);
    if (body === undefined) return undefined;
    this.entries.delete(tag);
    this.entries.set(tag, body);
    return body;
  }

  set(tag: string, body: Uint8Array): void {
    this.delete(tag);
    if (body.byteLength > this.maxEntryBytes) return;
    this.entries.set(tag, body);
    this.total += body.byteLength;
    for (const [oldest, kept] of this.entries) {
      if (this.total <= this.maxBytes) break;
      this.entries.delete(oldest);
      this.total -= kept.byteLength;
    }
  }

  delete(tag: string): void {
    const kept = this.entries.get(tag);
    if (kept === undefined) return;
    this.entries.delete(tag);
    this.total -= kept.byteLength;
  }

  clear(): void {
    this.entries.clear();
    this.total = 0;
  }
}
