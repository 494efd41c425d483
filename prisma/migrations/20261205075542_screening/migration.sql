-- AlterTable
ALTER TABLE "Pickup" ADD COLUMN "phoneDistanceBand" TEXT;

-- CreateTable
CREATE TABLE "ScreeningFlag" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "sourceId" INTEGER NOT NULL,
    "signal" TEXT NOT NULL,
    "subjectKey" TEXT NOT NULL,
    "message" TEXT NOT NULL,
    "measured" REAL NOT NULL,
    "threshold" REAL NOT NULL,
    "pickupCodes" TEXT NOT NULL DEFAULT '',
    "lotCodes" TEXT NOT NULL DEFAULT '',
    "raisedAt" DATETIME NOT NULL,
    "status" TEXT NOT NULL DEFAULT 'OPEN',
    "decidedAt" DATETIME,
    "decidedById" INTEGER,
    "reason" TEXT NOT NULL DEFAULT '',
    "heldLots" TEXT NOT NULL DEFAULT '',
    CONSTRAINT "ScreeningFlag_sourceId_fkey" FOREIGN KEY ("sourceId") REFERENCES "Source" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- RedefineTables
PRAGMA defer_foreign_keys=ON;
PRAGMA foreign_keys=OFF;
CREATE TABLE "new_Source" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "kind" TEXT NOT NULL,
    "materials" TEXT NOT NULL,
    "address" TEXT NOT NULL DEFAULT '',
    "certificateNo" TEXT,
    "certificateScheme" TEXT,
    "certificateExpires" DATETIME,
    "pickupEveryDays" INTEGER,
    "collectorNote" TEXT NOT NULL DEFAULT '',
    "active" BOOLEAN NOT NULL DEFAULT true,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "capacityBasis" TEXT,
    "fryers" INTEGER,
    "fryerLitres" REAL,
    "changesPerWeek" REAL,
    "declaredLitresPerMonth" REAL,
    "capacityDeclaredAt" DATETIME,
    "capacityDeclaredBy" TEXT,
    "latitude" REAL,
    "longitude" REAL,
    "opensHour" INTEGER,
    "closesHour" INTEGER,
    "onWatch" BOOLEAN NOT NULL DEFAULT false,
    "creditWithheld" BOOLEAN NOT NULL DEFAULT false,
    CONSTRAINT "Source_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);
INSERT INTO "new_Source" ("active", "address", "certificateExpires", "certificateNo", "certificateScheme", "code", "collectorNote", "createdAt", "id", "kind", "materials", "name", "pickupEveryDays", "siteId") SELECT "active", "address", "certificateExpires", "certificateNo", "certificateScheme", "code", "collectorNote", "createdAt", "id", "kind", "materials", "name", "pickupEveryDays", "siteId" FROM "Source";
DROP TABLE "Source";
ALTER TABLE "new_Source" RENAME TO "Source";
CREATE UNIQUE INDEX "Source_siteId_code_key" ON "Source"("siteId", "code");
CREATE TABLE "new_FeedstockLot" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "material" TEXT NOT NULL,
    "origin" TEXT NOT NULL,
    "supplierId" INTEGER,
    "deliveryDocument" TEXT,
    "receivedAt" DATETIME NOT NULL,
    "observedVolumeMl" INTEGER NOT NULL,
    "observedTempC" REAL NOT NULL,
    "densityKgM3" REAL NOT NULL,
    "referenceTempC" REAL NOT NULL DEFAULT 15,
    "densitySource" TEXT NOT NULL,
    "standardVolumeMl" INTEGER NOT NULL,
    "massG" INTEGER NOT NULL,
    "status" TEXT NOT NULL,
    "certified" BOOLEAN NOT NULL DEFAULT false,
    "screeningHold" BOOLEAN NOT NULL DEFAULT false,
    "notes" TEXT NOT NULL DEFAULT '',
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "FeedstockLot_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "FeedstockLot_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "FeedstockLot_supplierId_fkey" FOREIGN KEY ("supplierId") REFERENCES "Source" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_FeedstockLot" ("certified", "code", "createdAt", "deliveryDocument", "densityKgM3", "densitySource", "holderId", "id", "massG", "material", "notes", "observedTempC", "observedVolumeMl", "origin", "receivedAt", "referenceTempC", "siteId", "standardVolumeMl", "status", "supplierId") SELECT "certified", "code", "createdAt", "deliveryDocument", "densityKgM3", "densitySource", "holderId", "id", "massG", "material", "notes", "observedTempC", "observedVolumeMl", "origin", "receivedAt", "referenceTempC", "siteId", "standardVolumeMl", "status", "supplierId" FROM "FeedstockLot";
DROP TABLE "FeedstockLot";
ALTER TABLE "new_FeedstockLot" RENAME TO "FeedstockLot";
CREATE UNIQUE INDEX "FeedstockLot_holderId_key" ON "FeedstockLot"("holderId");
CREATE INDEX "FeedstockLot_status_idx" ON "FeedstockLot"("status");
CREATE INDEX "FeedstockLot_receivedAt_idx" ON "FeedstockLot"("receivedAt");
CREATE UNIQUE INDEX "FeedstockLot_siteId_code_key" ON "FeedstockLot"("siteId", "code");
PRAGMA foreign_keys=ON;
PRAGMA defer_foreign_keys=OFF;

-- CreateIndex
CREATE INDEX "ScreeningFlag_siteId_status_idx" ON "ScreeningFlag"("siteId", "status");

-- CreateIndex
CREATE UNIQUE INDEX "ScreeningFlag_siteId_sourceId_signal_subjectKey_key" ON "ScreeningFlag"("siteId", "sourceId", "signal", "subjectKey");
