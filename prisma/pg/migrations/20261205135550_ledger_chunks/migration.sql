-- CreateTable
CREATE TABLE "LedgerChunk" (
    "id" SERIAL NOT NULL,
    "siteId" INTEGER NOT NULL,
    "afterId" INTEGER NOT NULL,
    "lastId" INTEGER NOT NULL,
    "rowCount" INTEGER NOT NULL,
    "format" TEXT NOT NULL,
    "body" BYTEA NOT NULL,

    CONSTRAINT "LedgerChunk_pkey" PRIMARY KEY ("id")
);

-- CreateIndex
CREATE UNIQUE INDEX "LedgerChunk_siteId_afterId_key" ON "LedgerChunk"("siteId", "afterId");
