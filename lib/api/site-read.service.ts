import "server-only";
import { requireReader } from "@/lib/auth/request.service";
import { handled } from "@/lib/api/handle.service";
import { respond } from "@/lib/api/json-route.service";
import type { Db } from "@/lib/core/connect";
import { getDb } from "@/lib/core/db";
import { fail } from "@/lib/core/result";
import { getSiteById } from "@/lib/site/site.store";

type Reader = Extract<Awaited<ReturnType<typeof requireReader>>, { ok: true }>["value"];
type Site = NonNullable<Awaited<ReturnType<typeof getSiteById>>>;

export interface SiteRead {
  request: Request;
  db: Db;
  site: Site;
  who: Reader;
  /** The request's query parameters, as the services' query schemas take them. */
  query: Record<string, string>;
}

/** A GET route that answers about the reader's own site: who may read it, which site, then the answer. */
export function siteReadRoute(
  route: string,
  answer: (r: SiteRead) => Promise<Response>,
): (request: Request) => Promise<Response> {
  return handled(route, async (request: Request): Promise<Response> => {
    const who = await requireReader(request);
    if (!who.ok) return respond(who);
    const db = await getDb();
    const site = await getSiteById(db, who.value.siteId);
    if (!site) return respond(fail("RECORD.NOT_FOUND", "Your site is not set up"));
    return answer({ request, db, site, who: who.value, query: Object.fromEntries(new URL(request.url).searchParams) });
  });
}
