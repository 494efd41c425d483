// The rows the chain-of-custody ledger is built from, as the custody store reads them.

export interface EntryMoveRow {
  id: number;
  at: Date;
  toHolderId: number;
  massG: number;
}

export interface BatchMoveRow {
  id: number;
  at: Date;
  role: string;
  fromHolderId: number | null;
  toHolderId: number;
  massG: number;
}

export interface CustodyBatchRow {
  holderId: number;
  code: string;
  completedAt: Date | null;
}

export interface CustodyShipmentRow {
  holderId: number;
  documentNo: string;
  customer: string;
  shippedAt: Date;
  massG: number;
  certifiedClaim: boolean;
}

export interface CustodyLedgerRows {
  /** Movements that brought material into the books (no source holder), reversed pairs left out. */
  entries: EntryMoveRow[];
  /** Oil charged to and ester drawn from batches, and receiving shortfalls booked from lots to the loss account. */
  batchMoves: BatchMoveRow[];
  lotLosses: BatchMoveRow[];
  batches: CustodyBatchRow[];
  shipments: CustodyShipmentRow[];
}
