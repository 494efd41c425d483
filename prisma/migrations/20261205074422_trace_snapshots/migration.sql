-- CreateTable
CREATE TABLE "TraceSnapshot" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "ledgerOrder" TEXT NOT NULL,
    "appliedCount" INTEGER NOT NULL,
    "lastMoveId" INTEGER,
    "format" TEXT NOT NULL,
    "body" TEXT NOT NULL
);

-- CreateIndex
CREATE UNIQUE INDEX "TraceSnapshot_siteId_ledgerOrder_appliedCount_key" ON "TraceSnapshot"("siteId", "ledgerOrder", "appliedCount");
