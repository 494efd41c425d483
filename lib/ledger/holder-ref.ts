// The ledger's names for holders and the trace core's whole-ledger shape, kept out of the store so pure
// modules (trace reports, graph layout) can type their inputs without reaching the database layer.
import type { HolderKind } from "@/lib/core/vocabulary";
import type { TraceHolder, TraceMove } from "@/lib/ledger/moves";

/** A place that held material, as the pages name and link it. */
export interface HolderRef {
  id: number;
  kind: HolderKind;
  code: string;
}

export interface TraceLedger {
  holders: TraceHolder[];
  moves: TraceMove[];
  /** Every holder of the site by id, to name the trace's answers. */
  refs: ReadonlyMap<number, HolderRef>;
  /** Movements left out of the trace because they are reversed pairs (a booking error and its correction). */
  reversedPairsLeftOut: number;
  /** Movement rows read, reversed pairs included, and the highest id among them: where extendTraceLedger resumes. */
  rowsRead: number;
  lastMoveId: number;
}
