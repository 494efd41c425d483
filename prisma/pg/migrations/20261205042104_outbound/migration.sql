-- AlterTable
ALTER TABLE "Tank" ADD COLUMN     "strappingJson" TEXT NOT NULL DEFAULT '';

-- AlterTable
ALTER TABLE "TankGauge" ADD COLUMN     "bookStockG" INTEGER,
ADD COLUMN     "densityKgM3" DOUBLE PRECISION,
ADD COLUMN     "levelMm" INTEGER,
ADD COLUMN     "method" TEXT NOT NULL DEFAULT 'VOLUME',
ADD COLUMN     "note" TEXT NOT NULL DEFAULT '',
ADD COLUMN     "recordedAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
ADD COLUMN     "recordedById" INTEGER;

-- AlterTable
ALTER TABLE "ProductLot" ADD COLUMN     "decidedAt" TIMESTAMP(3),
ADD COLUMN     "decidedById" INTEGER,
ADD COLUMN     "decisionReason" TEXT NOT NULL DEFAULT '',
ADD COLUMN     "deviation" BOOLEAN NOT NULL DEFAULT false,
ADD COLUMN     "specKey" TEXT NOT NULL DEFAULT '';

-- AlterTable
ALTER TABLE "QcResult" ADD COLUMN     "lab" TEXT NOT NULL DEFAULT '',
ADD COLUMN     "recordedAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
ADD COLUMN     "recordedById" INTEGER,
ADD COLUMN     "reportNo" TEXT NOT NULL DEFAULT '',
ADD COLUMN     "supersedesId" INTEGER,
ADD COLUMN     "verdict" TEXT NOT NULL DEFAULT '';

-- AlterTable
ALTER TABLE "Shipment" ADD COLUMN     "compartment" TEXT NOT NULL DEFAULT '',
ADD COLUMN     "customerId" INTEGER,
ADD COLUMN     "vehicle" TEXT NOT NULL DEFAULT '';

-- AlterTable
ALTER TABLE "WasteContainer" ADD COLUMN     "characterisedAt" TIMESTAMP(3),
ADD COLUMN     "fullAt" TIMESTAMP(3),
ADD COLUMN     "location" TEXT NOT NULL DEFAULT '';

-- AlterTable
ALTER TABLE "Disposal" ADD COLUMN     "containerCode" TEXT NOT NULL DEFAULT '',
ADD COLUMN     "destination" TEXT NOT NULL DEFAULT '';

-- CreateTable
CREATE TABLE "Customer" (
    "id" SERIAL NOT NULL,
    "siteId" INTEGER NOT NULL,
    "code" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "address" TEXT NOT NULL DEFAULT '',
    "contact" TEXT NOT NULL DEFAULT '',
    "active" BOOLEAN NOT NULL DEFAULT true,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,

    CONSTRAINT "Customer_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "SiteSpec" (
    "id" SERIAL NOT NULL,
    "siteId" INTEGER NOT NULL,
    "name" TEXT NOT NULL,
    "version" INTEGER NOT NULL,
    "baseKey" TEXT NOT NULL,
    "customerId" INTEGER,
    "limitsJson" TEXT NOT NULL,
    "reason" TEXT NOT NULL,
    "createdById" INTEGER NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL,

    CONSTRAINT "SiteSpec_pkey" PRIMARY KEY ("id")
);

-- CreateIndex
CREATE UNIQUE INDEX "Customer_siteId_code_key" ON "Customer"("siteId", "code");

-- CreateIndex
CREATE UNIQUE INDEX "SiteSpec_siteId_name_version_key" ON "SiteSpec"("siteId", "name", "version");

-- CreateIndex
CREATE UNIQUE INDEX "QcResult_supersedesId_key" ON "QcResult"("supersedesId");

-- AddForeignKey
ALTER TABLE "Shipment" ADD CONSTRAINT "Shipment_customerId_fkey" FOREIGN KEY ("customerId") REFERENCES "Customer"("id") ON DELETE SET NULL ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "Customer" ADD CONSTRAINT "Customer_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site"("id") ON DELETE RESTRICT ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "SiteSpec" ADD CONSTRAINT "SiteSpec_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site"("id") ON DELETE RESTRICT ON UPDATE CASCADE;
