import "server-only";
import { headers } from "next/headers";
import { forbidden, redirect } from "next/navigation";
import { cache } from "react";
import { getDb } from "@/lib/core/db";
import type { Db } from "@/lib/core/connect";
import { getSiteById } from "@/lib/site/site.store";
import type { SiteRow } from "@/lib/site/site.store";
import { getSignedIn } from "@/lib/auth/request.service";
import { warmTraceCache } from "@/lib/trace/trace.service";
import type { SignedIn } from "@/lib/auth/request.service";
import { canRead, homeFor } from "@/lib/auth/read-matrix";

const FIRST_PASSWORD_PATH = "/me/password";

/**
 * The database, the signed-in user and their site, once per request; pages need a signed-in user who
 * may read the page asked for (lib/auth/read-matrix.ts). A collector sent to the overview goes to
 * their route instead; any other page a role may not read answers 403 with no data.
 */
export const loadSite = cache(async (): Promise<{ db: Db; site: SiteRow | null; user: SignedIn }> => {
  const user = await getSignedIn();
  if (!user) redirect("/login");
  const path = (await headers()).get("x-pathname") ?? "";
  // A password an administrator chose opens one page only: the one where the user chooses their own.
  if (user.mustChangePassword && path !== FIRST_PASSWORD_PATH) redirect(FIRST_PASSWORD_PATH);
  if (!canRead(user.role, path)) {
    if (path === "/" && homeFor(user.role) !== "/") redirect(homeFor(user.role));
    forbidden();
  }
  const db = await getDb();
  return { db, site: await getSiteById(db, user.siteId), user };
});

/** For the layout: the user and site when signed in, without redirecting (the sign-in page uses the layout too). */
export const loadHeader = cache(async (): Promise<{ site: SiteRow | null; user: SignedIn | null }> => {
  const user = await getSignedIn();
  if (!user) return { site: null, user: null };
  const db = await getDb();
  const site = await getSiteById(db, user.siteId);
  // The first page a signed-in user sees starts the site's trace index (a whole-ledger replay, once per
  // server start) so that traces, lot pages and "made of" answer from snapshots when asked.
  if (site) warmTraceCache(db, site.id, new Date());
  return { site, user };
});
