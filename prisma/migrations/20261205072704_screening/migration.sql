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
PRAGMA foreign_keys=ON;
PRAGMA defer_foreign_keys=OFF;

-- CreateIndex
CREATE INDEX "ScreeningFlag_siteId_status_idx" ON "ScreeningFlag"("siteId", "status");

-- CreateIndex
CREATE UNIQUE INDEX "ScreeningFlag_siteId_sourceId_signal_subjectKey_key" ON "ScreeningFlag"("siteId", "sourceId", "signal", "subjectKey");
