-- CreateTable
CREATE TABLE "LedgerChunk" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "afterId" INTEGER NOT NULL,
    "lastId" INTEGER NOT NULL,
    "rowCount" INTEGER NOT NULL,
    "format" TEXT NOT NULL,
    "body" BLOB NOT NULL
);

-- CreateIndex
CREATE UNIQUE INDEX "LedgerChunk_siteId_afterId_key" ON "LedgerChunk"("siteId", "afterId");
