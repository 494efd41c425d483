import "server-only";
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db, Tx } from "@/lib/core/connect";
import { failMany } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import { parseInput } from "@/lib/ledger/parse";
import type { Actor } from "@/lib/core/actor";
import { getBuiltInSpec, listBuiltInSpecs } from "@/lib/spec/spec";
import type { Spec } from "@/lib/spec/spec";
import { applySiteLimits, changedLimits, siteLimitIssues } from "@/lib/spec/site-spec";
import { parseSiteSpecKey, SiteSpecInputSchema, siteSpecKey } from "@/lib/spec/site-spec.schema";
import type { SiteLimits } from "@/lib/spec/site-spec.schema";
import {
  getLatestSiteSpec,
  getSiteSpec,
  insertSiteSpec,
  listSiteSpecs,
  requireCustomer,
} from "@/lib/spec/site-spec.store";
import type { SiteSpecRow } from "@/lib/spec/site-spec.store";

function canonical(limits: SiteLimits): string {
  return JSON.stringify(
    Object.keys(limits)
      .sort()
      .map((k) => [k, limits[k]?.min ?? null, limits[k]?.max ?? null]),
  );
}

export interface SavedSiteSpec {
  id: number;
  key: string;
  name: string;
  version: number;
}

/**
 * Copies a built-in edition and grade into a named site specification (version 1), or writes the next
 * version of one. A version is never edited: every change is a new row with its reason, audited.
 * Limits may be tightened (or added to a reported property), never loosened.
 */
export async function saveSiteSpec(db: Db, actor: Actor, input: unknown): Promise<Result<SavedSiteSpec>> {
  const parsed = parseInput(SiteSpecInputSchema, input);
  if (!parsed.ok) return parsed;
  const { baseKey, name, customerId, previousVersion, limits, reason } = parsed.value;
  const base = getBuiltInSpec(baseKey);
  if (base === null)
    return failMany([
      {
        code: "SITESPEC.UNKNOWN_BASE",
        message: "Copied from: choose a specification edition and grade",
        field: "baseKey",
      },
    ]);
  const issues = siteLimitIssues(base, limits);
  if (issues.length > 0) return failMany(issues);
  const changed = changedLimits(base, limits);
  return runInTransaction(db, async (tx) => {
    const latest = await getLatestSiteSpec(tx, actor.siteId, name);
    if (previousVersion === undefined && latest !== null) {
      reject(
        "SITESPEC.NAME_TAKEN",
        `A site specification named ${name} already exists (version ${latest.version}); open it to make a new version`,
        "name",
      );
    }
    if (previousVersion !== undefined && latest === null)
      reject("RECORD.NOT_FOUND", `No site specification named ${name}`, "name");
    if (latest !== null && previousVersion !== latest.version) {
      reject(
        "SITESPEC.STALE",
        `${name} is at version ${latest.version} now; open the latest version and make your change there`,
        "name",
      );
    }
    if (
      latest !== null &&
      latest.baseKey === baseKey &&
      latest.customerId === (customerId ?? null) &&
      canonical(latest.limits) === canonical(changed)
    ) {
      reject(
        "SITESPEC.NO_CHANGE",
        `Nothing differs from version ${latest.version}: change at least one limit`,
        "reason",
      );
    }
    if (customerId !== undefined) await requireCustomer(tx, actor.siteId, customerId);
    const version = (latest?.version ?? 0) + 1;
    const id = await insertSiteSpec(tx, {
      siteId: actor.siteId,
      name,
      version,
      baseKey,
      customerId: customerId ?? null,
      limits: changed,
      reason,
      createdById: actor.userId,
      createdAt: actor.now,
    });
    await appendAudit(tx, actor, {
      action: version === 1 ? "CREATE" : "CHANGE",
      entity: "SiteSpec",
      entityKey: name,
      ...(latest === null
        ? {}
        : { before: { version: latest.version, baseKey: latest.baseKey, limits: latest.limits } }),
      after: { version, baseKey, customerId: customerId ?? null, limits: changed },
      reason,
    });
    return { id, key: siteSpecKey(id), name, version };
  });
}

/** The Spec one stored version resolves to, or null when its base edition is no longer built in. */
export function resolveSiteSpec(row: SiteSpecRow): Spec | null {
  const base = getBuiltInSpec(row.baseKey);
  return base === null
    ? null
    : applySiteLimits(base, row.limits, {
        key: siteSpecKey(row.id),
        name: row.name,
        version: row.version,
        reason: row.reason,
      });
}

/**
 * Resolves a specification key: a built-in edition and grade ("astm-d6751-23a/no-2-b-s15") or one
 * version of a site specification ("site:<id>", only the site's own).
 */
export async function getSpecByKey(db: Db | Tx, siteId: number, key: string): Promise<Spec | null> {
  const builtIn = getBuiltInSpec(key);
  if (builtIn !== null) return builtIn;
  const id = parseSiteSpecKey(key);
  if (id === null) return null;
  const row = await getSiteSpec(db, siteId, id);
  return row === null ? null : resolveSiteSpec(row);
}

export interface SiteSpecView {
  row: SiteSpecRow;
  spec: Spec | null;
}

/** Every version of the site's specifications with what each resolves to. */
export async function listSiteSpecViews(db: Db, siteId: number): Promise<SiteSpecView[]> {
  return (await listSiteSpecs(db, siteId)).map((row) => ({ row, spec: resolveSiteSpec(row) }));
}

/**
 * Every specification a product lot can be judged against, for a choice list: the built-in editions and
 * grades, then the current version of each site specification.
 */
export async function listSpecChoices(db: Db, siteId: number): Promise<Array<{ key: string; label: string }>> {
  const builtIn = listBuiltInSpecs().map((s) => ({ key: s.key, label: `${s.edition} ${s.grade}` }));
  const rows = await listSiteSpecs(db, siteId);
  const current = new Map<string, SiteSpecRow>();
  for (const r of rows) if ((current.get(r.name)?.version ?? 0) < r.version) current.set(r.name, r);
  const site = [...current.values()]
    .filter((r) => getBuiltInSpec(r.baseKey) !== null)
    .map((r) => ({ key: siteSpecKey(r.id), label: `${r.name} (site, version ${r.version})` }));
  return [...builtIn, ...site];
}
