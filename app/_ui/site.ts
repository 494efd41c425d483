import "server-only";
import { cache } from "react";
import { getDb } from "@/lib/db";
import type { Db } from "@/lib/database/connect";
import { getDefaultSite } from "@/lib/site/site.store";
import type { SiteRow } from "@/lib/site/site.store";

/** The database and the site shown, once per request. */
export const loadSite = cache(async (): Promise<{ db: Db; site: SiteRow | null }> => {
  const db = await getDb();
  return { db, site: await getDefaultSite(db) };
});
