-- CreateTable
CREATE TABLE "Site" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "code" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "town" TEXT NOT NULL,
    "timeZone" TEXT NOT NULL DEFAULT 'UTC',
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP
);

-- CreateTable
CREATE TABLE "User" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "login" TEXT NOT NULL,
    "fullName" TEXT NOT NULL,
    "role" TEXT NOT NULL,
    "unitSystem" TEXT NOT NULL DEFAULT 'metric',
    "passwordHash" TEXT,
    "active" BOOLEAN NOT NULL DEFAULT true,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "User_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Source" (
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
    CONSTRAINT "Source_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Holder" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "kind" TEXT NOT NULL,
    "code" TEXT NOT NULL,
    "stockG" INTEGER NOT NULL DEFAULT 0 CHECK ("stockG" >= 0),
    CONSTRAINT "Holder_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Pickup" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "sourceId" INTEGER NOT NULL,
    "collectorId" INTEGER NOT NULL,
    "material" TEXT NOT NULL,
    "observedAt" DATETIME NOT NULL,
    "receivedAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "containers" INTEGER NOT NULL,
    "containerTags" TEXT NOT NULL DEFAULT '',
    "volumeMl" INTEGER NOT NULL,
    "tempC" REAL NOT NULL,
    "massG" INTEGER NOT NULL,
    "waterLook" TEXT NOT NULL DEFAULT '',
    "solidsLook" TEXT NOT NULL DEFAULT '',
    "notes" TEXT NOT NULL DEFAULT '',
    "idempotencyKey" TEXT,
    "lotId" INTEGER,
    CONSTRAINT "Pickup_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Pickup_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Pickup_sourceId_fkey" FOREIGN KEY ("sourceId") REFERENCES "Source" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Pickup_collectorId_fkey" FOREIGN KEY ("collectorId") REFERENCES "User" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Pickup_lotId_fkey" FOREIGN KEY ("lotId") REFERENCES "FeedstockLot" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "FeedstockLot" (
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
    "notes" TEXT NOT NULL DEFAULT '',
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "FeedstockLot_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "FeedstockLot_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "FeedstockLot_supplierId_fkey" FOREIGN KEY ("supplierId") REFERENCES "Source" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Titration" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "lotId" INTEGER NOT NULL,
    "analystId" INTEGER NOT NULL,
    "testedAt" DATETIME NOT NULL,
    "sampleMassG" REAL NOT NULL,
    "titrant" TEXT NOT NULL,
    "concentrationMolL" REAL NOT NULL,
    "titreMl" REAL NOT NULL,
    "blankMl" REAL NOT NULL DEFAULT 0,
    "basis" TEXT NOT NULL DEFAULT 'OLEIC',
    "ffaPct" REAL NOT NULL,
    "acidValue" REAL NOT NULL,
    "voided" BOOLEAN NOT NULL DEFAULT false,
    CONSTRAINT "Titration_lotId_fkey" FOREIGN KEY ("lotId") REFERENCES "FeedstockLot" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Titration_analystId_fkey" FOREIGN KEY ("analystId") REFERENCES "User" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "LabTest" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "lotId" INTEGER NOT NULL,
    "analystId" INTEGER NOT NULL,
    "testedAt" DATETIME NOT NULL,
    "kind" TEXT NOT NULL,
    "method" TEXT NOT NULL,
    "valuePct" REAL NOT NULL,
    "voided" BOOLEAN NOT NULL DEFAULT false,
    CONSTRAINT "LabTest_lotId_fkey" FOREIGN KEY ("lotId") REFERENCES "FeedstockLot" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "LabTest_analystId_fkey" FOREIGN KEY ("analystId") REFERENCES "User" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Tank" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "service" TEXT NOT NULL,
    "capacityMl" INTEGER NOT NULL,
    "mixing" TEXT NOT NULL DEFAULT 'MIXED',
    CONSTRAINT "Tank_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Tank_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "TankGauge" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "tankId" INTEGER NOT NULL,
    "at" DATETIME NOT NULL,
    "volumeMl" INTEGER NOT NULL,
    "tempC" REAL NOT NULL,
    "massG" INTEGER NOT NULL,
    CONSTRAINT "TankGauge_tankId_fkey" FOREIGN KEY ("tankId") REFERENCES "Tank" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "ReagentLot" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "reagent" TEXT NOT NULL,
    "supplier" TEXT NOT NULL,
    "strengthPct" REAL NOT NULL,
    "receivedAt" DATETIME NOT NULL,
    "massG" INTEGER NOT NULL,
    CONSTRAINT "ReagentLot_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "ReagentLot_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Batch" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "status" TEXT NOT NULL,
    "pretreated" BOOLEAN NOT NULL DEFAULT false,
    "plannedAt" DATETIME NOT NULL,
    "startedAt" DATETIME,
    "completedAt" DATETIME,
    "targetOilG" INTEGER NOT NULL,
    "molarRatio" REAL NOT NULL DEFAULT 6,
    "catalyst" TEXT NOT NULL,
    "reactionTempC" REAL NOT NULL DEFAULT 60,
    "recipeJson" TEXT NOT NULL DEFAULT '{}',
    "notes" TEXT NOT NULL DEFAULT '',
    CONSTRAINT "Batch_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Batch_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "ProductLot" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "batchId" INTEGER,
    "producedAt" DATETIME NOT NULL,
    "massG" INTEGER NOT NULL,
    "status" TEXT NOT NULL,
    "releasedAt" DATETIME,
    CONSTRAINT "ProductLot_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "ProductLot_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "ProductLot_batchId_fkey" FOREIGN KEY ("batchId") REFERENCES "Batch" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "QcResult" (
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
    CONSTRAINT "QcResult_productLotId_fkey" FOREIGN KEY ("productLotId") REFERENCES "ProductLot" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Shipment" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "documentNo" TEXT NOT NULL,
    "customer" TEXT NOT NULL,
    "shippedAt" DATETIME NOT NULL,
    "massG" INTEGER NOT NULL,
    "volumeMl" INTEGER NOT NULL,
    "certifiedClaim" BOOLEAN NOT NULL DEFAULT false,
    CONSTRAINT "Shipment_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Shipment_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "WasteContainer" (
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
    CONSTRAINT "WasteContainer_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "WasteContainer_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Disposal" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "holderId" INTEGER NOT NULL,
    "hauler" TEXT NOT NULL,
    "documentNo" TEXT NOT NULL,
    "disposedAt" DATETIME NOT NULL,
    "massG" INTEGER NOT NULL,
    CONSTRAINT "Disposal_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Disposal_holderId_fkey" FOREIGN KEY ("holderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "AccountingPeriod" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "startsAt" DATETIME NOT NULL,
    "endsAt" DATETIME NOT NULL,
    "status" TEXT NOT NULL,
    "closedAt" DATETIME,
    "closedById" INTEGER,
    CONSTRAINT "AccountingPeriod_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "AccountingPeriod_closedById_fkey" FOREIGN KEY ("closedById") REFERENCES "User" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Movement" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "at" DATETIME NOT NULL,
    "role" TEXT NOT NULL,
    "fromHolderId" INTEGER,
    "toHolderId" INTEGER NOT NULL,
    "massG" INTEGER NOT NULL CHECK ("massG" > 0),
    "volumeMl" INTEGER,
    "tempC" REAL,
    "note" TEXT NOT NULL DEFAULT '',
    "recordedById" INTEGER NOT NULL,
    "recordedAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "reversesId" INTEGER,
    CONSTRAINT "Movement_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Movement_fromHolderId_fkey" FOREIGN KEY ("fromHolderId") REFERENCES "Holder" ("id") ON DELETE SET NULL ON UPDATE CASCADE,
    CONSTRAINT "Movement_toHolderId_fkey" FOREIGN KEY ("toHolderId") REFERENCES "Holder" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Movement_recordedById_fkey" FOREIGN KEY ("recordedById") REFERENCES "User" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "Movement_reversesId_fkey" FOREIGN KEY ("reversesId") REFERENCES "Movement" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateIndex
CREATE UNIQUE INDEX "Site_code_key" ON "Site"("code");

-- CreateIndex
CREATE UNIQUE INDEX "User_login_key" ON "User"("login");

-- CreateIndex
CREATE UNIQUE INDEX "Source_siteId_code_key" ON "Source"("siteId", "code");

-- CreateIndex
CREATE INDEX "Holder_kind_idx" ON "Holder"("kind");

-- CreateIndex
CREATE UNIQUE INDEX "Holder_siteId_kind_code_key" ON "Holder"("siteId", "kind", "code");

-- CreateIndex
CREATE UNIQUE INDEX "Pickup_holderId_key" ON "Pickup"("holderId");

-- CreateIndex
CREATE UNIQUE INDEX "Pickup_idempotencyKey_key" ON "Pickup"("idempotencyKey");

-- CreateIndex
CREATE INDEX "Pickup_sourceId_observedAt_idx" ON "Pickup"("sourceId", "observedAt");

-- CreateIndex
CREATE INDEX "Pickup_observedAt_idx" ON "Pickup"("observedAt");

-- CreateIndex
CREATE UNIQUE INDEX "Pickup_siteId_code_key" ON "Pickup"("siteId", "code");

-- CreateIndex
CREATE UNIQUE INDEX "FeedstockLot_holderId_key" ON "FeedstockLot"("holderId");

-- CreateIndex
CREATE INDEX "FeedstockLot_status_idx" ON "FeedstockLot"("status");

-- CreateIndex
CREATE INDEX "FeedstockLot_receivedAt_idx" ON "FeedstockLot"("receivedAt");

-- CreateIndex
CREATE UNIQUE INDEX "FeedstockLot_siteId_code_key" ON "FeedstockLot"("siteId", "code");

-- CreateIndex
CREATE INDEX "Titration_lotId_idx" ON "Titration"("lotId");

-- CreateIndex
CREATE INDEX "LabTest_lotId_idx" ON "LabTest"("lotId");

-- CreateIndex
CREATE UNIQUE INDEX "Tank_holderId_key" ON "Tank"("holderId");

-- CreateIndex
CREATE UNIQUE INDEX "Tank_siteId_code_key" ON "Tank"("siteId", "code");

-- CreateIndex
CREATE INDEX "TankGauge_tankId_at_idx" ON "TankGauge"("tankId", "at");

-- CreateIndex
CREATE UNIQUE INDEX "ReagentLot_holderId_key" ON "ReagentLot"("holderId");

-- CreateIndex
CREATE UNIQUE INDEX "ReagentLot_siteId_code_key" ON "ReagentLot"("siteId", "code");

-- CreateIndex
CREATE UNIQUE INDEX "Batch_holderId_key" ON "Batch"("holderId");

-- CreateIndex
CREATE INDEX "Batch_status_idx" ON "Batch"("status");

-- CreateIndex
CREATE UNIQUE INDEX "Batch_siteId_code_key" ON "Batch"("siteId", "code");

-- CreateIndex
CREATE UNIQUE INDEX "ProductLot_holderId_key" ON "ProductLot"("holderId");

-- CreateIndex
CREATE UNIQUE INDEX "ProductLot_siteId_code_key" ON "ProductLot"("siteId", "code");

-- CreateIndex
CREATE INDEX "QcResult_productLotId_idx" ON "QcResult"("productLotId");

-- CreateIndex
CREATE UNIQUE INDEX "Shipment_holderId_key" ON "Shipment"("holderId");

-- CreateIndex
CREATE UNIQUE INDEX "Shipment_siteId_documentNo_key" ON "Shipment"("siteId", "documentNo");

-- CreateIndex
CREATE UNIQUE INDEX "WasteContainer_holderId_key" ON "WasteContainer"("holderId");

-- CreateIndex
CREATE UNIQUE INDEX "WasteContainer_siteId_code_key" ON "WasteContainer"("siteId", "code");

-- CreateIndex
CREATE UNIQUE INDEX "Disposal_holderId_key" ON "Disposal"("holderId");

-- CreateIndex
CREATE UNIQUE INDEX "Disposal_siteId_documentNo_key" ON "Disposal"("siteId", "documentNo");

-- CreateIndex
CREATE UNIQUE INDEX "AccountingPeriod_siteId_startsAt_key" ON "AccountingPeriod"("siteId", "startsAt");

-- CreateIndex
CREATE UNIQUE INDEX "Movement_reversesId_key" ON "Movement"("reversesId");

-- CreateIndex
CREATE INDEX "Movement_siteId_at_idx" ON "Movement"("siteId", "at");

-- CreateIndex
CREATE INDEX "Movement_fromHolderId_at_idx" ON "Movement"("fromHolderId", "at");

-- CreateIndex
CREATE INDEX "Movement_toHolderId_at_idx" ON "Movement"("toHolderId", "at");

-- Append-only ledger: corrections are new reversing rows, never edits.
CREATE TRIGGER "Movement_no_update" BEFORE UPDATE ON "Movement"
BEGIN SELECT RAISE(ABORT, 'LEDGER.APPEND_ONLY: movements cannot be changed; post a reversal'); END;
CREATE TRIGGER "Movement_no_delete" BEFORE DELETE ON "Movement"
BEGIN SELECT RAISE(ABORT, 'LEDGER.APPEND_ONLY: movements cannot be deleted; post a reversal'); END;
