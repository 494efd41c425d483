-- CreateIndex
CREATE INDEX "Movement_siteId_id_idx" ON "Movement"("siteId", "id");
