// What the trace store reads about a ledger and the holders material enters at, in plain shapes the pure
// trace modules take in.
import type { HolderKind } from "@/lib/core/vocabulary";

/**
 * Identifies one state of a site's ledger. Movements are append-only (triggers refuse UPDATE and
 * DELETE), so a new booking always changes the count and the last id.
 */
export interface LedgerVersion {
  count: number;
  lastId: number | null;
}

export interface SourceFacts {
  code: string;
  name: string;
  kind: string;
  certificateScheme: string | null;
  certificateNo: string | null;
  certificateExpires: Date | null;
  /** Compliance withholds this source's certified credit after a confirmed screening flag. */
  creditWithheld: boolean;
}

export interface LotFacts {
  holderId: number;
  code: string;
  material: string;
  origin: string;
  certified: boolean;
  receivedAt: Date;
}

/** What is known about a holder that material enters the books at (a pickup, a delivered lot, a reagent lot). */
export interface EntryHolderFacts {
  holderId: number;
  kind: HolderKind;
  code: string;
  pickup: { code: string; observedAt: Date } | null;
  /** The lot the material was received into (a pickup's lot, or the delivered lot itself). */
  lot: LotFacts | null;
  source: SourceFacts | null;
  material: string | null;
  reagent: { reagent: string; supplier: string } | null;
}

export interface TraceSubject {
  kind: HolderKind | "SOURCE";
  code: string;
  /** The holders the question is about: the holder itself, or a source's pickups and delivered lots. */
  holderIds: number[];
  label: string;
}
