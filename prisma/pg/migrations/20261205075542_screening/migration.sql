-- AlterTable
ALTER TABLE "Source" ADD COLUMN     "capacityBasis" TEXT,
ADD COLUMN     "capacityDeclaredAt" TIMESTAMP(3),
ADD COLUMN     "capacityDeclaredBy" TEXT,
ADD COLUMN     "changesPerWeek" DOUBLE PRECISION,
ADD COLUMN     "closesHour" INTEGER,
ADD COLUMN     "creditWithheld" BOOLEAN NOT NULL DEFAULT false,
ADD COLUMN     "declaredLitresPerMonth" DOUBLE PRECISION,
ADD COLUMN     "fryerLitres" DOUBLE PRECISION,
ADD COLUMN     "fryers" INTEGER,
ADD COLUMN     "latitude" DOUBLE PRECISION,
ADD COLUMN     "longitude" DOUBLE PRECISION,
ADD COLUMN     "onWatch" BOOLEAN NOT NULL DEFAULT false,
ADD COLUMN     "opensHour" INTEGER;

-- AlterTable
ALTER TABLE "Pickup" ADD COLUMN     "phoneDistanceBand" TEXT;

-- AlterTable
ALTER TABLE "FeedstockLot" ADD COLUMN     "screeningHold" BOOLEAN NOT NULL DEFAULT false;

-- CreateTable
CREATE TABLE "ScreeningFlag" (
    "id" SERIAL NOT NULL,
    "siteId" INTEGER NOT NULL,
    "sourceId" INTEGER NOT NULL,
    "signal" TEXT NOT NULL,
    "subjectKey" TEXT NOT NULL,
    "message" TEXT NOT NULL,
    "measured" DOUBLE PRECISION NOT NULL,
    "threshold" DOUBLE PRECISION NOT NULL,
    "pickupCodes" TEXT NOT NULL DEFAULT '',
    "lotCodes" TEXT NOT NULL DEFAULT '',
    "raisedAt" TIMESTAMP(3) NOT NULL,
    "status" TEXT NOT NULL DEFAULT 'OPEN',
    "decidedAt" TIMESTAMP(3),
    "decidedById" INTEGER,
    "reason" TEXT NOT NULL DEFAULT '',
    "heldLots" TEXT NOT NULL DEFAULT '',

    CONSTRAINT "ScreeningFlag_pkey" PRIMARY KEY ("id")
);

-- CreateIndex
CREATE INDEX "ScreeningFlag_siteId_status_idx" ON "ScreeningFlag"("siteId", "status");

-- CreateIndex
CREATE UNIQUE INDEX "ScreeningFlag_siteId_sourceId_signal_subjectKey_key" ON "ScreeningFlag"("siteId", "sourceId", "signal", "subjectKey");

-- AddForeignKey
ALTER TABLE "ScreeningFlag" ADD CONSTRAINT "ScreeningFlag_sourceId_fkey" FOREIGN KEY ("sourceId") REFERENCES "Source"("id") ON DELETE RESTRICT ON UPDATE CASCADE;
