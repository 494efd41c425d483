// Who may read what: one table for every page, GET route, export and report. The menu is drawn from
// it, pages and GET routes enforce it on the server, and the browser test walks the build's own route
// list against it, so a route missing here is refused until someone decides.
import type { SiteRole } from "@/lib/core/vocabulary";

const C: SiteRole = "COLLECTOR";
const P: SiteRole = "PRODUCTION";
const Q: SiteRole = "COMPLIANCE";
const A: SiteRole = "ADMIN";
const EVERYONE: readonly SiteRole[] = [C, P, Q, A];
const PLANT: readonly SiteRole[] = [P, Q, A];
const OFFICE: readonly SiteRole[] = [Q, A];

export interface ReadRule {
  /** A path prefix, matched at segment boundaries ("/lots" covers "/lots/L-1" but not "/lotsx"). */
  path: string;
  roles: readonly SiteRole[] | "public";
  /** Shown in the menu under this label, for the roles that may read it. */
  menu?: string;
}

/** In menu order. Longer prefixes win over shorter ones. */
export const READ_MATRIX: readonly ReadRule[] = [
  { path: "/", roles: PLANT, menu: "Today" },
  { path: "/collect", roles: [C, P], menu: "Collect" },
  { path: "/pickups", roles: EVERYONE, menu: "Pickups" },
  { path: "/sources", roles: EVERYONE, menu: "Sources" },
  { path: "/receiving", roles: PLANT, menu: "Receiving" },
  { path: "/lots", roles: PLANT, menu: "Lots" },
  { path: "/labels", roles: EVERYONE, menu: "Labels" },
  { path: "/lab", roles: PLANT, menu: "Lab" },
  { path: "/tanks", roles: PLANT, menu: "Tanks" },
  { path: "/plan", roles: PLANT, menu: "Plan a batch" },
  { path: "/batches", roles: PLANT, menu: "Batches" },
  { path: "/products", roles: PLANT, menu: "Product lots" },
  { path: "/specs", roles: PLANT, menu: "Specifications" },
  { path: "/shipments", roles: OFFICE, menu: "Shipments" },
  { path: "/customers", roles: OFFICE, menu: "Customers" },
  { path: "/waste", roles: PLANT, menu: "Waste" },
  { path: "/waste/rules", roles: PLANT },
  { path: "/trace", roles: PLANT, menu: "Trace" },
  // Recall and its report: production sees where material went but not to which customers (left out in the answer).
  { path: "/trace/recall", roles: PLANT, menu: "Recall" },
  { path: "/balance", roles: OFFICE, menu: "Balance" },
  { path: "/periods", roles: OFFICE, menu: "Periods" },
  { path: "/limits", roles: PLANT, menu: "Site limits" },
  { path: "/screening", roles: OFFICE, menu: "Source checks" },
  { path: "/screening/thresholds", roles: OFFICE },
  { path: "/ledger", roles: PLANT, menu: "Ledger" },
  // Record history has its own rule for accounts (the owner and administrators).
  { path: "/history", roles: EVERYONE },
  { path: "/grid", roles: PLANT, menu: "Grid" },
  { path: "/admin", roles: [A], menu: "Accounts" },
  { path: "/admin/site", roles: [A], menu: "Site settings" },
  { path: "/references", roles: PLANT, menu: "References" },
  { path: "/me", roles: EVERYONE },
  { path: "/login", roles: "public" },
  { path: "/collect/sw.js", roles: "public" },
  // JSON and exports
  { path: "/api/openapi.json", roles: "public" },
  { path: "/api/me", roles: EVERYONE },
  { path: "/api/compute", roles: EVERYONE },
  { path: "/api/holders", roles: PLANT },
  { path: "/api/trace", roles: PLANT },
  { path: "/api/balance", roles: OFFICE },
  { path: "/api/epcis/period", roles: OFFICE },
  { path: "/api/epcis/trace", roles: PLANT },
  { path: "/api/custody", roles: OFFICE },
  { path: "/api/waste", roles: PLANT },
  { path: "/api/grid", roles: PLANT },
  { path: "/api/batches", roles: PLANT },
  { path: "/api/products", roles: PLANT },
];

function covers(prefix: string, pathname: string): boolean {
  if (prefix === "/") return pathname === "/";
  return pathname === prefix || pathname.startsWith(`${prefix}/`);
}

/** The rule for a path: the longest prefix that covers it, or null when the matrix has none. */
export function readRuleFor(pathname: string, matrix: readonly ReadRule[] = READ_MATRIX): ReadRule | null {
  let best: ReadRule | null = null;
  for (const rule of matrix)
    if (covers(rule.path, pathname) && (best === null || rule.path.length > best.path.length)) best = rule;
  return best;
}

/** Roles allowed to read a path; an unlisted path is read by no one. */
export function readersOf(pathname: string, matrix: readonly ReadRule[] = READ_MATRIX): readonly SiteRole[] | "public" {
  return readRuleFor(pathname, matrix)?.roles ?? [];
}

export function canRead(role: SiteRole | null, pathname: string, matrix: readonly ReadRule[] = READ_MATRIX): boolean {
  const roles = readersOf(pathname, matrix);
  if (roles === "public") return true;
  return role !== null && roles.includes(role);
}

/** The menu for one role: only what it may read. */
export function menuFor(
  role: SiteRole,
  matrix: readonly ReadRule[] = READ_MATRIX,
): Array<{ href: string; label: string }> {
  return matrix
    .filter((r) => r.menu !== undefined && r.roles !== "public" && r.roles.includes(role))
    .map((r) => ({ href: r.path, label: r.menu ?? r.path }));
}

/** Where a role starts: collectors at their route, everyone else on the day's overview. */
export function homeFor(role: SiteRole): string {
  return role === "COLLECTOR" ? "/collect" : "/";
}
