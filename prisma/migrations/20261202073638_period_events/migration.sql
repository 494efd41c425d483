-- CreateTable
CREATE TABLE "PeriodEvent" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "periodId" INTEGER NOT NULL,
    "action" TEXT NOT NULL,
    "reason" TEXT NOT NULL,
    "byId" INTEGER NOT NULL,
    "at" DATETIME NOT NULL,
    CONSTRAINT "PeriodEvent_periodId_fkey" FOREIGN KEY ("periodId") REFERENCES "AccountingPeriod" ("id") ON DELETE RESTRICT ON UPDATE CASCADE,
    CONSTRAINT "PeriodEvent_byId_fkey" FOREIGN KEY ("byId") REFERENCES "User" ("id") ON DELETE RESTRICT ON UPDATE CASCADE
);

-- CreateIndex
CREATE INDEX "PeriodEvent_periodId_idx" ON "PeriodEvent"("periodId");
