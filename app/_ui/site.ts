import "server-only";
import { redirect } from "next/navigation";
import { cache } from "react";
import { getDb } from "@/lib/db";
import type { Db } from "@/lib/database/connect";
import { getSiteById } from "@/lib/site/site.store";
import type { SiteRow } from "@/lib/site/site.store";
import { getSignedIn } from "@/lib/auth/request.service";
import type { SignedIn } from "@/lib/auth/request.service";

/** The database, the signed-in user and their site, once per request; pages need a signed-in user. */
export const loadSite = cache(async (): Promise<{ db: Db; site: SiteRow | null; user: SignedIn }> => {
  const user = await getSignedIn();
  if (!user) redirect("/login");
  const db = await getDb();
  return { db, site: await getSiteById(db, user.siteId), user };
});

/** For the layout: the user and site when signed in, without redirecting (the sign-in page uses the layout too). */
export const loadHeader = cache(async (): Promise<{ site: SiteRow | null; user: SignedIn | null }> => {
  const user = await getSignedIn();
  if (!user) return { site: null, user: null };
  return { site: await getSiteById(await getDb(), user.siteId), user };
});
