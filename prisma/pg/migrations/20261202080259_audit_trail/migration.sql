-- CreateTable
CREATE TABLE "AuditEvent" (
    "id" SERIAL NOT NULL,
    "siteId" INTEGER NOT NULL,
    "seq" INTEGER NOT NULL,
    "at" TIMESTAMP(3) NOT NULL,
    "actorId" INTEGER NOT NULL,
    "action" TEXT NOT NULL,
    "entity" TEXT NOT NULL,
    "entityKey" TEXT NOT NULL,
    "before" TEXT NOT NULL DEFAULT '',
    "after" TEXT NOT NULL DEFAULT '',
    "reason" TEXT NOT NULL DEFAULT '',
    "prevHash" TEXT NOT NULL,
    "hash" TEXT NOT NULL,

    CONSTRAINT "AuditEvent_pkey" PRIMARY KEY ("id")
);

-- CreateTable
CREATE TABLE "AuditHead" (
    "siteId" INTEGER NOT NULL,
    "seq" INTEGER NOT NULL DEFAULT 0,
    "lastHash" TEXT NOT NULL DEFAULT '',

    CONSTRAINT "AuditHead_pkey" PRIMARY KEY ("siteId")
);

-- CreateIndex
CREATE INDEX "AuditEvent_entity_entityKey_idx" ON "AuditEvent"("entity", "entityKey");

-- CreateIndex
CREATE UNIQUE INDEX "AuditEvent_siteId_seq_key" ON "AuditEvent"("siteId", "seq");
