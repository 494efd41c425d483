// One computation per question at a time: while a question is being answered, everyone else who asks
// the same question waits for that answer instead of starting the same work again. Under load, right
// after a booking moves the ledger position, dozens of readers miss the kept answers at once; this turns
// their dozens of identical computations into one. The key must name everything the answer depends on
// (for answers kept by ledger position: the question and the position). Process-local by design: it
// never changes an answer, only how many times this process computes it.

export class SingleFlight<T> {
  private readonly running = new Map<string, Promise<T>>();

  /** How many questions are being answered now. */
  get size(): number {
    return this.running.size;
  }

  /** fn's answer; `first` is true for the caller whose fn ran. A failure reaches every waiting caller. */
  async run(key: string, fn: () => Promise<T>): Promise<{ value: T; first: boolean }> {
    const running = this.running.get(key);
    if (running !== undefined) return { value: await running, first: false };
    const started = fn().finally(() => this.running.delete(key));
    this.running.set(key, started);
    return { value: await started, first: true };
  }
}
