import "server-only";
import type { Db, Tx } from "@/lib/core/connect";
import { reject } from "@/lib/ledger/transaction.store";
import { SiteLimitsSchema } from "@/lib/spec/site-spec.schema";
import type { SiteLimits } from "@/lib/spec/site-spec.schema";

export interface SiteSpecRow {
  id: number;
  name: string;
  version: number;
  baseKey: string;
  customerId: number | null;
  customerName: string | null;
  limits: SiteLimits;
  reason: string;
  createdBy: string;
  createdAt: Date;
}

const SELECT = {
  id: true,
  name: true,
  version: true,
  baseKey: true,
  customerId: true,
  limitsJson: true,
  reason: true,
  createdById: true,
  createdAt: true,
} as const;

type Raw = {
  id: number;
  name: string;
  version: number;
  baseKey: string;
  customerId: number | null;
  limitsJson: string;
  reason: string;
  createdById: number;
  createdAt: Date;
};

/** Stored limits are read back through the same schema they were written with. */
function readLimits(json: string, id: number): SiteLimits {
  const parsed = SiteLimitsSchema.safeParse(JSON.parse(json));
  if (!parsed.success) throw new Error(`Site specification ${id}: stored limits are malformed`);
  return parsed.data;
}

async function decorate(db: Db | Tx, rows: Raw[]): Promise<SiteSpecRow[]> {
  const userIds = [...new Set(rows.map((r) => r.createdById))];
  const customerIds = [...new Set(rows.flatMap((r) => (r.customerId === null ? [] : [r.customerId])))];
  const [users, customers] = await Promise.all([
    userIds.length
      ? db.user.findMany({ where: { id: { in: userIds } }, select: { id: true, fullName: true } })
      : Promise.resolve([]),
    customerIds.length
      ? db.customer.findMany({ where: { id: { in: customerIds } }, select: { id: true, name: true } })
      : Promise.resolve([]),
  ]);
  const userName = new Map(users.map((u) => [u.id, u.fullName]));
  const customerName = new Map(customers.map((c) => [c.id, c.name]));
  return rows.map(({ limitsJson, createdById, ...r }) => ({
    ...r,
    limits: readLimits(limitsJson, r.id),
    createdBy: userName.get(createdById) ?? "",
    customerName: r.customerId === null ? null : (customerName.get(r.customerId) ?? null),
  }));
}

/** Every version of every site specification, by name then version. */
export async function listSiteSpecs(db: Db, siteId: number): Promise<SiteSpecRow[]> {
  const rows = await db.siteSpec.findMany({
    where: { siteId },
    select: SELECT,
    orderBy: [{ name: "asc" }, { version: "asc" }],
  });
  return decorate(db, rows);
}

export async function getSiteSpec(db: Db | Tx, siteId: number, id: number): Promise<SiteSpecRow | null> {
  const row = await db.siteSpec.findFirst({ where: { siteId, id }, select: SELECT });
  return row === null ? null : ((await decorate(db, [row]))[0] ?? null);
}

/** The latest version of a named site specification, or null when the name is new. */
export async function getLatestSiteSpec(tx: Db | Tx, siteId: number, name: string): Promise<SiteSpecRow | null> {
  const row = await tx.siteSpec.findFirst({ where: { siteId, name }, select: SELECT, orderBy: { version: "desc" } });
  return row === null ? null : ((await decorate(tx, [row]))[0] ?? null);
}

export async function requireCustomer(tx: Tx, siteId: number, customerId: number): Promise<void> {
  const c = await tx.customer.findFirst({ where: { siteId, id: customerId }, select: { id: true } });
  if (!c) reject("RECORD.NOT_FOUND", `Customer ${customerId} does not exist on this site`, "customerId");
}

export async function listCustomerChoices(
  db: Db,
  siteId: number,
): Promise<Array<{ id: number; code: string; name: string }>> {
  return db.customer.findMany({
    where: { siteId, active: true },
    select: { id: true, code: true, name: true },
    orderBy: { name: "asc" },
  });
}

function isUniqueViolation(e: unknown): boolean {
  return typeof e === "object" && e !== null && "code" in e && (e as { code?: unknown }).code === "P2002";
}

/** Writes one new version; a concurrent writer of the same version loses with a conflict. */
export async function insertSiteSpec(
  tx: Tx,
  data: {
    siteId: number;
    name: string;
    version: number;
    baseKey: string;
    customerId: number | null;
    limits: SiteLimits;
    reason: string;
    createdById: number;
    createdAt: Date;
  },
): Promise<number> {
  const { limits, ...rest } = data;
  try {
    const row = await tx.siteSpec.create({
      data: { ...rest, limitsJson: JSON.stringify(limits) },
      select: { id: true },
    });
    return row.id;
  } catch (e) {
    if (isUniqueViolation(e))
      reject(
        "SITESPEC.STALE",
        `${data.name} version ${data.version} was just saved by someone else; open the latest version and change it again`,
        "name",
      );
    throw e;
  }
}
