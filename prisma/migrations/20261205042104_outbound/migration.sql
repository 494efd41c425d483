-- CreateTable
CREATE TABLE "Customer" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "address" TEXT NOT NULL DEFAULT '',
    "contact" TEXT NOT NULL DEFAULT '',
    "active" BOOLEAN NOT NULL DEFAULT true,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Customer_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "SiteSpec" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "name" TEXT NOT NULL,
    "version" INTEGER NOT NULL,
    "baseKey" TEXT NOT NULL,
    "customerId" INTEGER,
    "limitsJson" TEXT NOT NULL,
    "reason" TEXT NOT NULL,
    "createdById" INTEGER NOT NULL,
    "createdAt" DATETIME NOT NULL,
    CONSTRAINT "SiteSpec_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- RedefineTables
PRAGMA defer_foreign_keys=ON;
PRAGMA foreign_keys=OFF;
CREATE TABLE "new_Tank" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "service" TEXT NOT NULL,
    "capacityMl" INTEGER NOT NULL,
    "mixing" TEXT NOT NULL DEFAULT 'MIXED',
    "strappingJson" TEXT NOT NULL DEFAULT '',
    CONSTRAINT "Tank_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Tank_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);
INSERT INTO "new_Tank" ("capacityMl", "code", "holderId", "id", "mixing", "name", "service", "siteId") SELECT "capacityMl", "code", "holderId", "id", "mixing", "name", "service", "siteId" FROM "Tank";
DROP TABLE "Tank";
ALTER TABLE "new_Tank" RENAME TO "Tank";
CREATE UNIQUE INDEX "Tank_holderId_key" ON "Tank"("holderId");
CREATE UNIQUE INDEX "Tank_siteId_code_key" ON "Tank"("siteId", "code");
CREATE TABLE "new_TankGauge" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "tankId" INTEGER NOT NULL,
    "at" DATETIME NOT NULL,
    "volumeMl" INTEGER NOT NULL,
    "tempC" REAL NOT NULL,
    "massG" INTEGER NOT NULL,
    "method" TEXT NOT NULL DEFAULT 'VOLUME',
    "levelMm" INTEGER,
    "densityKgM3" REAL,
    "bookStockG" INTEGER,
    "note" TEXT NOT NULL DEFAULT '',
    "recordedById" INTEGER,
    "recordedAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "TankGauge_tankId_fkey" FOREIGN KEY ("tankId") REFERENCES "Tank" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);
INSERT INTO "new_TankGauge" ("at", "id", "massG", "tankId", "tempC", "volumeMl") SELECT "at", "id", "massG", "tankId", "tempC", "volumeMl" FROM "TankGauge";
DROP TABLE "TankGauge";
ALTER TABLE "new_TankGauge" RENAME TO "TankGauge";
CREATE INDEX "TankGauge_tankId_at_idx" ON "TankGauge"("tankId", "at");
CREATE TABLE "new_ProductLot" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "batchId" INTEGER,
    "producedAt" DATETIME NOT NULL,
    "massG" INTEGER NOT NULL,
    "status" TEXT NOT NULL,
    "releasedAt" DATETIME,
    "specKey" TEXT NOT NULL DEFAULT '',
    "decisionReason" TEXT NOT NULL DEFAULT '',
    "deviation" BOOLEAN NOT NULL DEFAULT false,
    "decidedAt" DATETIME,
    "decidedById" INTEGER,
    CONSTRAINT "ProductLot_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "ProductLot_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "ProductLot_batchId_fkey" FOREIGN KEY ("batchId") REFERENCES "Batch" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_ProductLot" ("batchId", "code", "holderId", "id", "massG", "producedAt", "releasedAt", "siteId", "status") SELECT "batchId", "code", "holderId", "id", "massG", "producedAt", "releasedAt", "siteId", "status" FROM "ProductLot";
DROP TABLE "ProductLot";
ALTER TABLE "new_ProductLot" RENAME TO "ProductLot";
CREATE UNIQUE INDEX "ProductLot_holderId_key" ON "ProductLot"("holderId");
CREATE UNIQUE INDEX "ProductLot_siteId_code_key" ON "ProductLot"("siteId", "code");
CREATE TABLE "new_QcResult" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "productLotId" INTEGER NOT NULL,
    "property" TEXT NOT NULL,
    "method" TEXT NOT NULL,
    "value" REAL NOT NULL,
    "unit" TEXT NOT NULL,
    "limitMin" REAL,
    "limitMax" REAL,
    "specRef" TEXT NOT NULL,
    "pass" BOOLEAN NOT NULL,
    "testedAt" DATETIME NOT NULL,
    "verdict" TEXT NOT NULL DEFAULT '',
    "lab" TEXT NOT NULL DEFAULT '',
    "reportNo" TEXT NOT NULL DEFAULT '',
    "supersedesId" INTEGER,
    "recordedById" INTEGER,
    "recordedAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "QcResult_productLotId_fkey" FOREIGN KEY ("productLotId") REFERENCES "ProductLot" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);
INSERT INTO "new_QcResult" ("id", "limitMax", "limitMin", "method", "pass", "productLotId", "property", "specRef", "testedAt", "unit", "value") SELECT "id", "limitMax", "limitMin", "method", "pass", "productLotId", "property", "specRef", "testedAt", "unit", "value" FROM "QcResult";
DROP TABLE "QcResult";
ALTER TABLE "new_QcResult" RENAME TO "QcResult";
CREATE UNIQUE INDEX "QcResult_supersedesId_key" ON "QcResult"("supersedesId");
CREATE INDEX "QcResult_productLotId_idx" ON "QcResult"("productLotId");
CREATE TABLE "new_Shipment" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "documentNo" TEXT NOT NULL,
    "customer" TEXT NOT NULL,
    "customerId" INTEGER,
    "shippedAt" DATETIME NOT NULL,
    "massG" INTEGER NOT NULL,
    "volumeMl" INTEGER NOT NULL,
    "certifiedClaim" BOOLEAN NOT NULL DEFAULT false,
    "vehicle" TEXT NOT NULL DEFAULT '',
    "compartment" TEXT NOT NULL DEFAULT '',
    CONSTRAINT "Shipment_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Shipment_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Shipment_customerId_fkey" FOREIGN KEY ("customerId") REFERENCES "Customer" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_Shipment" ("certifiedClaim", "customer", "documentNo", "holderId", "id", "massG", "shippedAt", "siteId", "volumeMl") SELECT "certifiedClaim", "customer", "documentNo", "holderId", "id", "massG", "shippedAt", "siteId", "volumeMl" FROM "Shipment";
DROP TABLE "Shipment";
ALTER TABLE "new_Shipment" RENAME TO "Shipment";
CREATE UNIQUE INDEX "Shipment_holderId_key" ON "Shipment"("holderId");
CREATE UNIQUE INDEX "Shipment_siteId_documentNo_key" ON "Shipment"("siteId", "documentNo");
CREATE TABLE "new_WasteContainer" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "stream" TEXT NOT NULL,
    "accumulationStart" DATETIME NOT NULL,
    "capacityMl" INTEGER NOT NULL,
    "satellite" BOOLEAN NOT NULL DEFAULT false,
    "methanolPct" REAL,
    "pH" REAL,
    "flashPointC" REAL,
    "waterPct" REAL,
    "status" TEXT NOT NULL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "location" TEXT NOT NULL DEFAULT '',
    "fullAt" DATETIME,
    "characterisedAt" DATETIME,
    CONSTRAINT "WasteContainer_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "WasteContainer_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);
INSERT INTO "new_WasteContainer" ("accumulationStart", "capacityMl", "code", "createdAt", "flashPointC", "holderId", "id", "methanolPct", "pH", "satellite", "siteId", "status", "stream", "waterPct") SELECT "accumulationStart", "capacityMl", "code", "createdAt", "flashPointC", "holderId", "id", "methanolPct", "pH", "satellite", "siteId", "status", "stream", "waterPct" FROM "WasteContainer";
DROP TABLE "WasteContainer";
ALTER TABLE "new_WasteContainer" RENAME TO "WasteContainer";
CREATE UNIQUE INDEX "WasteContainer_holderId_key" ON "WasteContainer"("holderId");
CREATE UNIQUE INDEX "WasteContainer_siteId_code_key" ON "WasteContainer"("siteId", "code");
CREATE TABLE "new_Disposal" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "hauler" TEXT NOT NULL,
    "documentNo" TEXT NOT NULL,
    "disposedAt" DATETIME NOT NULL,
    "massG" INTEGER NOT NULL,
    "destination" TEXT NOT NULL DEFAULT '',
    "containerCode" TEXT NOT NULL DEFAULT '',
    CONSTRAINT "Disposal_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Disposal_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);
INSERT INTO "new_Disposal" ("disposedAt", "documentNo", "hauler", "holderId", "id", "massG", "siteId") SELECT "disposedAt", "documentNo", "hauler", "holderId", "id", "massG", "siteId" FROM "Disposal";
DROP TABLE "Disposal";
ALTER TABLE "new_Disposal" RENAME TO "Disposal";
CREATE UNIQUE INDEX "Disposal_holderId_key" ON "Disposal"("holderId");
CREATE UNIQUE INDEX "Disposal_siteId_documentNo_key" ON "Disposal"("siteId", "documentNo");
PRAGMA foreign_keys=ON;
PRAGMA defer_foreign_keys=OFF;

-- CreateIndex
CREATE UNIQUE INDEX "Customer_siteId_code_key" ON "Customer"("siteId", "code");

-- CreateIndex
CREATE UNIQUE INDEX "SiteSpec_siteId_name_version_key" ON "SiteSpec"("siteId", "name", "version");
