// Tamper evidence for the audit trail: each event's hash covers the previous hash and the event's
// own fields in a canonical form, so changing or removing any stored event breaks every later hash.
import { createHash } from "node:crypto";
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";

export interface AuditFields {
  siteId: number;
  seq: number;
  at: Date;
  actorId: number;
  action: string;
  entity: string;
  entityKey: string;
  before: string;
  after: string;
  reason: string;
}

export interface ChainedEvent extends AuditFields {
  prevHash: string;
  hash: string;
}

/** Fixed field order, ISO time, JSON string escaping: the same bytes on every machine and database. */
export function canonicalAudit(e: AuditFields): string {
  return JSON.stringify([
    e.siteId,
    e.seq,
    e.at.toISOString(),
    e.actorId,
    e.action,
    e.entity,
    e.entityKey,
    e.before,
    e.after,
    e.reason,
  ]);
}

export function chainHash(prevHash: string, e: AuditFields): string {
  return createHash("sha256").update(prevHash).update("\n").update(canonicalAudit(e)).digest("hex");
}

/** Checks one site's chain in sequence order: numbering without gaps, links, and each hash. */
export function verifyChain(events: readonly ChainedEvent[]): Result<{ events: number; lastHash: string }> {
  let prev = "";
  let expectedSeq = 1;
  for (const e of events) {
    if (e.seq !== expectedSeq)
      return fail("AUDIT.CHAIN_GAP", `Audit event ${expectedSeq} is missing (found ${e.seq} next)`, "seq");
    if (e.prevHash !== prev)
      return fail("AUDIT.CHAIN_BROKEN", `Audit event ${e.seq} does not link to event ${e.seq - 1}`, "prevHash");
    if (chainHash(prev, e) !== e.hash)
      return fail(
        "AUDIT.EVENT_ALTERED",
        `Audit event ${e.seq} (${e.entity} ${e.entityKey}) was altered after it was written`,
        "hash",
      );
    prev = e.hash;
    expectedSeq++;
  }
  return ok({ events: events.length, lastHash: prev });
}
