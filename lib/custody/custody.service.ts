import "server-only";
// Chain of custody by mass balance for the custody page and GET /api/custody. Built from the books:
//   INPUT       certified feedstock as received: per lot and characteristic set, the grams of the origins
//               whose lot is marked certified and whose source held a valid certificate on the day;
//   CONVERSION  a receiving shortfall of such a lot is written off (zero output), and each finished batch
//               converts the certified oil it was charged with (from the genealogy) into methyl ester at
//               the batch's own measured yield (ester out ÷ oil in);
//   CLAIM       each shipment marked as a certified claim debits methyl ester credit.
// The pure ledger (buildCustodyLedger) checks every booking in time order under the active rule set.
import type { Db } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { ok } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { RULESET_EU_2022_996 } from "@/lib/custody/custody-balance";
import { bookMaterial, collectInputs, movesToCompose } from "@/lib/custody/custody-inputs";
import { assembleCustodyReport } from "@/lib/custody/custody-report";
import type { CustodyReport } from "@/lib/custody/custody-report";
import { CustodyQuerySchema } from "@/lib/custody/custody.schema";
import { loadCustodyRows } from "@/lib/custody/custody.store";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import { getEntryHolderFacts, getMoveCompositions } from "@/lib/trace/trace.service";

export { OUTPUT_MATERIAL, WRITTEN_OFF } from "@/lib/custody/custody-inputs";
export type { ConversionRow, SetInputs } from "@/lib/custody/custody-inputs";
export type { AccountView, ClaimRow, CustodyReport, DescribedEntry } from "@/lib/custody/custody-report";

/** The chain-of-custody ledger of a site under RULESET_EU_2022_996: inputs, conversions, claims, running balances. */
export async function getCustodyReport(
  db: Db,
  site: { id: number; timeZone: string },
  input: unknown,
  now: Date,
): Promise<Result<CustodyReport>> {
  const started = performance.now();
  const parsed = parseInput(CustodyQuerySchema, input);
  if (!parsed.ok) return parsed;
  const [rows, facts] = await Promise.all([loadCustodyRows(db, site.id), getEntryHolderFacts(db, site.id)]);
  const inputs = collectInputs(rows.entries, facts);
  // The certified share of receiving shortfalls and of the oil charged to batches, from the genealogy.
  const { oilMoves, moveIds } = movesToCompose(rows);
  const composed = await getMoveCompositions(db, site.id, moveIds, now);
  if (!composed.ok) return composed;
  const report = assembleCustodyReport({
    query: parsed.value,
    siteId: site.id,
    ruleSet: RULESET_EU_2022_996,
    utcOffsetMin: getUtcOffsetMin(site.timeZone, now),
    shipments: rows.shipments,
    inputs,
    booked: bookMaterial(rows, inputs, oilMoves, composed.value.carried),
    nowMs: now.getTime(),
  });
  if (!report.ok) return report;
  return ok({ ...report.value, computeMs: performance.now() - started, trace: composed.value.freshness });
}
