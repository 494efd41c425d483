-- CreateTable
CREATE TABLE "AuditEvent" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "seq" INTEGER NOT NULL,
    "at" DATETIME NOT NULL,
    "actorId" INTEGER NOT NULL,
    "action" TEXT NOT NULL,
    "entity" TEXT NOT NULL,
    "entityKey" TEXT NOT NULL,
    "before" TEXT NOT NULL DEFAULT '',
    "after" TEXT NOT NULL DEFAULT '',
    "reason" TEXT NOT NULL DEFAULT '',
    "prevHash" TEXT NOT NULL,
    "hash" TEXT NOT NULL
);

-- CreateTable
CREATE TABLE "AuditHead" (
    "siteId" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "seq" INTEGER NOT NULL DEFAULT 0,
    "lastHash" TEXT NOT NULL DEFAULT ''
);

-- CreateIndex
CREATE INDEX "AuditEvent_entity_entityKey_idx" ON "AuditEvent"("entity", "entityKey");

-- CreateIndex
CREATE UNIQUE INDEX "AuditEvent_siteId_seq_key" ON "AuditEvent"("siteId", "seq");

-- Append-only AuditEvent: corrections are new rows, never edits.
CREATE TRIGGER "AuditEvent_no_update" BEFORE UPDATE ON "AuditEvent"
BEGIN SELECT RAISE(ABORT, 'AUDIT.APPEND_ONLY: audit events cannot be changed; post a correction'); END;
CREATE TRIGGER "AuditEvent_no_delete" BEFORE DELETE ON "AuditEvent"
BEGIN SELECT RAISE(ABORT, 'AUDIT.APPEND_ONLY: audit events cannot be deleted; post a correction'); END;
