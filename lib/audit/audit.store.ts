import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { insertRows } from "@/lib/core/bulk-insert";
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
export async function appendAudit(
  tx: Tx,
  actor: { siteId: number; userId: number; now: Date },
  e: AuditEntry,
): Promise<void> {
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

/** Appends many events in order with one head update (bulk imports); the same chain as one appendAudit per event. */
export async function appendAuditMany(
  tx: Tx,
  actor: { siteId: number; userId: number; now: Date },
  entries: readonly AuditEntry[],
): Promise<void> {
  if (entries.length === 0) return;
  const head = await tx.auditHead.upsert({
    where: { siteId: actor.siteId },
    create: { siteId: actor.siteId, seq: entries.length, lastHash: "" },
    update: { seq: { increment: entries.length } },
  });
  let prev = head.lastHash;
  let seq = head.seq - entries.length;
  const rows = entries.map((e) => {
    seq += 1;
    const fields = {
      siteId: actor.siteId,
      seq,
      at: actor.now,
      actorId: actor.userId,
      action: e.action,
      entity: e.entity,
      entityKey: e.entityKey,
      before: json(e.before),
      after: json(e.after),
      reason: e.reason ?? "",
    };
    const hash = chainHash(prev, fields);
    const row = { ...fields, prevHash: prev, hash };
    prev = hash;
    return row;
  });
  const columns = [
    "siteId",
    "seq",
    "at",
    "actorId",
    "action",
    "entity",
    "entityKey",
    "before",
    "after",
    "reason",
    "prevHash",
    "hash",
  ] as const;
  await insertRows(
    tx,
    "AuditEvent",
    columns,
    rows.map((r) => columns.map((c) => r[c])),
  );
  await tx.auditHead.update({ where: { siteId: actor.siteId }, data: { lastHash: prev } });
}

export async function loadChain(db: Db, siteId: number): Promise<ChainedEvent[]> {
  return db.auditEvent.findMany({ where: { siteId }, orderBy: { seq: "asc" } });
}

export interface AuditView {
  seq: number;
  at: Date;
  actor: string;
  actorLogin: string;
  action: string;
  entity: string;
  entityKey: string;
  before: string;
  after: string;
  reason: string;
  hash: string;
  /** This event's stored hash matches its fields and the hash it links to. */
  intact: boolean;
}

/** Every audit event stored under one record key for the given entities, oldest first. */
export async function listRecordHistory(
  db: Db,
  siteId: number,
  entity: string | readonly string[],
  entityKey: string,
): Promise<AuditView[]> {
  const entities = typeof entity === "string" ? [entity] : [...entity];
  const rows = await db.auditEvent.findMany({
    where: { siteId, entity: { in: entities }, entityKey },
    orderBy: { seq: "asc" },
  });
  const users = await db.user.findMany({
    where: { id: { in: [...new Set(rows.map((r) => r.actorId))] } },
    select: { id: true, fullName: true, login: true },
  });
  const actors = new Map(users.map((u) => [u.id, u]));
  return rows.map((r) => ({
    seq: r.seq,
    at: r.at,
    actor: actors.get(r.actorId)?.fullName ?? `user ${r.actorId}`,
    actorLogin: actors.get(r.actorId)?.login ?? "",
    action: r.action,
    entity: r.entity,
    entityKey: r.entityKey,
    before: r.before,
    after: r.after,
    reason: r.reason,
    hash: r.hash,
    intact: chainHash(r.prevHash, r) === r.hash,
  }));
}
