-- CreateTable
CREATE TABLE "TraceSnapshot" (
    "id" SERIAL NOT NULL,
    "siteId" INTEGER NOT NULL,
    "ledgerOrder" TEXT NOT NULL,
    "appliedCount" INTEGER NOT NULL,
    "lastMoveId" INTEGER,
    "format" TEXT NOT NULL,
    "body" TEXT NOT NULL,

    CONSTRAINT "TraceSnapshot_pkey" PRIMARY KEY ("id")
);

-- CreateIndex
CREATE UNIQUE INDEX "TraceSnapshot_siteId_ledgerOrder_appliedCount_key" ON "TraceSnapshot"("siteId", "ledgerOrder", "appliedCount");
