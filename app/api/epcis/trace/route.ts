import { canRead } from "@/lib/auth/read-matrix";
import { epcisForTrace } from "@/lib/epcis/epcis.service";
import { siteReadRoute } from "@/lib/api/site-read.service";
import { requestOrigin } from "@/app/labels/origin";
import { answerEpcis } from "@/app/api/epcis/download";

export const dynamic = "force-dynamic";

/** GET /api/epcis/trace?dir=back|fwd&kind=&code=&at= — the EPCIS 2.0 events behind one trace answer. */
export const GET = siteReadRoute("GET /api/epcis/trace", async ({ db, site, who, query }) =>
  answerEpcis(
    await epcisForTrace(db, site, query, who.now, {
      baseUri: await requestOrigin(),
      withCustomers: canRead(who.role, "/customers"),
    }),
  ),
);
