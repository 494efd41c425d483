-- CreateTable
CREATE TABLE "PeriodEvent" (
    "id" SERIAL NOT NULL,
    "periodId" INTEGER NOT NULL,
    "action" TEXT NOT NULL,
    "reason" TEXT NOT NULL,
    "byId" INTEGER NOT NULL,
    "at" TIMESTAMP(3) NOT NULL,

    CONSTRAINT "PeriodEvent_pkey" PRIMARY KEY ("id")
);

-- CreateIndex
CREATE INDEX "PeriodEvent_periodId_idx" ON "PeriodEvent"("periodId");

-- AddForeignKey
ALTER TABLE "PeriodEvent" ADD CONSTRAINT "PeriodEvent_periodId_fkey" FOREIGN KEY ("periodId") REFERENCES "AccountingPeriod"("id") ON DELETE RESTRICT ON UPDATE CASCADE;

-- AddForeignKey
ALTER TABLE "PeriodEvent" ADD CONSTRAINT "PeriodEvent_byId_fkey" FOREIGN KEY ("byId") REFERENCES "User"("id") ON DELETE RESTRICT ON UPDATE CASCADE;
