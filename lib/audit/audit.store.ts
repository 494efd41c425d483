import "server-only";
import type { Db, Tx } from "@/lib/database/connect";
import { chainHash } from "@/lib/audit/chain";
import type { ChainedEvent } from "@/lib/audit/chain";

export interface AuditEntry {
  action: "CREATE" | "CHANGE" | "VOID" | "CLOSE" | "REOPEN" | "RELEASE" | "REJECT";
  entity: string;
  entityKey: string;
  before?: unknown;
  after?: unknown;
  reason?: string;
}

function json(v: unknown): string {
  return v === undefined ? "" : JSON.stringify(v, (_k, x: unknown) => (typeof x === "bigint" ? x.toString() : x));
}

/**
 * Appends one event to the site's chain inside the caller's transaction. Bumping the head row first
 * takes its row lock (PostgreSQL) / the write lock (SQLite), so concurrent writers queue instead of forking the chain.
 */
export async function appendAudit(tx: Tx, actor: { siteId: number; userId: number; now: Date }, e: AuditEntry): Promise<void> {
  const head = await tx.auditHead.upsert({
    where: { siteId: actor.siteId },
    create: { siteId: actor.siteId, seq: 1, lastHash: "" },
    update: { seq: { increment: 1 } },
  });
  const fields = {
    siteId: actor.siteId,
    seq: head.seq,
    at: actor.now,
    actorId: actor.userId,
    action: e.action,
    entity: e.entity,
    entityKey: e.entityKey,
    before: json(e.before),
    after: json(e.after),
    reason: e.reason ?? "",
  };
  const hash = chainHash(head.lastHash, fields);
  await tx.auditEvent.create({ data: { ...fields, prevHash: head.lastHash, hash } });
  await tx.auditHead.update({ where: { siteId: actor.siteId }, data: { lastHash: hash } });
}

export async function loadChain(db: Db, siteId: number): Promise<ChainedEvent[]> {
  return db.auditEvent.findMany({ where: { siteId }, orderBy: { seq: "asc" } });
}

export interface AuditView {
  seq: number;
  at: Date;
  actor: string;
  action: string;
  entity: string;
  entityKey: string;
  before: string;
  after: string;
  reason: string;
}

export async function listRecordHistory(db: Db, siteId: number, entity: string, entityKey: string): Promise<AuditView[]> {
  const rows = await db.auditEvent.findMany({ where: { siteId, entity, entityKey }, orderBy: { seq: "asc" } });
  const actors = new Map((await db.user.findMany({ where: { id: { in: [...new Set(rows.map((r) => r.actorId))] } }, select: { id: true, fullName: true } })).map((u) => [u.id, u.fullName]));
  return rows.map((r) => ({ seq: r.seq, at: r.at, actor: actors.get(r.actorId) ?? `user ${r.actorId}`, action: r.action, entity: r.entity, entityKey: r.entityKey, before: r.before, after: r.after, reason: r.reason }));
}
