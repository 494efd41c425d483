import { canRead } from "@/lib/auth/read-matrix";
import { epcisForPeriod } from "@/lib/epcis/epcis.service";
import { siteReadRoute } from "@/lib/api/site-read.service";
import { requestOrigin } from "@/app/labels/origin";
import { answerEpcis } from "@/app/api/epcis/download";

export const dynamic = "force-dynamic";

/** GET /api/epcis/period?period=MONTH|QUARTER|CUSTOM&year=&month=&quarter=&start=&end= — the balance period's EPCIS 2.0 events. */
export const GET = siteReadRoute("GET /api/epcis/period", async ({ db, site, who, query }) =>
  answerEpcis(
    await epcisForPeriod(db, site, query, who.now, {
      baseUri: await requestOrigin(),
      withCustomers: canRead(who.role, "/customers"),
    }),
  ),
);
