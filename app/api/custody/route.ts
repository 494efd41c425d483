import { respond } from "@/lib/api/json-route.service";
import { getCustodyReport } from "@/lib/custody/custody.service";
import { siteReadRoute } from "@/lib/api/site-read.service";

export const dynamic = "force-dynamic";

/** GET /api/custody?period=2026-Q4&operatorType=&claimKg=&claimSet= — the chain-of-custody page's answer. */
export const GET = siteReadRoute("GET /api/custody", async ({ db, site, who, query }) =>
  respond(await getCustodyReport(db, site, query, who.now)),
);
