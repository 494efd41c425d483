// Traceability, balances, chain of custody and waste-due endpoints: their query shapes (shared with
// the pages, which send the same query strings) and their documentation. The answers come from the
// services the pages use (lib/trace/trace.service, lib/mass-balance/balance.service,
// lib/custody/custody.service, app/waste/due/due-report), so page and API reconcile exactly.
import { z } from "zod";
import type { EndpointDoc } from "@/lib/api/openapi";
import { emptyAsMissing as blank, oneOf } from "@/lib/core/fields";
import { GENERATOR_CATEGORIES } from "@/lib/waste/waste.schema";

// ---- trace, balance and custody ------------------------------------------------------------------

// The query shapes live with their domains (the services parse with them); re-exported here for the
// pages and the OpenAPI document below.
export {
  BACKWARD_KINDS,
  BackwardTraceQuerySchema,
  FORWARD_KINDS,
  ForwardTraceQuerySchema,
} from "@/lib/trace/trace-query.schema";
export type { BackwardKind, BackwardTraceQuery, ForwardKind, ForwardTraceQuery } from "@/lib/trace/trace-query.schema";
import { BackwardTraceQuerySchema, ForwardTraceQuerySchema } from "@/lib/trace/trace-query.schema";
export { BALANCE_PERIOD_KINDS, BalanceQuerySchema } from "@/lib/mass-balance/balance-query.schema";
export type { BalanceQuery } from "@/lib/mass-balance/balance-query.schema";
import { BalanceQuerySchema } from "@/lib/mass-balance/balance-query.schema";
export { CustodyQuerySchema } from "@/lib/custody/custody.schema";
export type { CustodyQuery } from "@/lib/custody/custody.schema";
import { CustodyQuerySchema } from "@/lib/custody/custody.schema";

// ---- waste due -----------------------------------------------------------------------------------

/** Days ahead when the form leaves it empty. */
export const DEFAULT_DUE_DAYS = 30;

/**
 * Query strings in; the numbers are then checked by the shared WasteDueQuerySchema and
 * WasteSiteSettingsSchema. Without a category the site's assumption applies (the strictest, LQG).
 */
export const WasteDuePageQuerySchema = z.object({
  days: z.preprocess(blank, z.coerce.number({ error: "Days ahead must be a number" }).default(DEFAULT_DUE_DAYS)),
  category: z.preprocess(blank, oneOf("Generator category", GENERATOR_CATEGORIES).optional()),
  tsdfMiles: z.preprocess(
    blank,
    z.coerce.number({ error: "Distance to the treatment facility (miles) must be a number" }).optional(),
  ),
});

// ---- periods -------------------------------------------------------------------------------------

// The routes parse with PeriodCloseSchema / PeriodReopenSchema, which live in lib/period/period.service.ts;
// a pure module may not import a service, so the request bodies are described here by shape only.
const PeriodActionBodyDoc = (reason: string) =>
  z.object({
    periodId: z.number().int().positive().describe("Accounting period record number"),
    reason: z.string().max(500).describe(reason),
  });

// ---- documentation -------------------------------------------------------------------------------

/** Traceability, balances and waste endpoints. */
export const TRACE_ENDPOINTS: EndpointDoc[] = [
  {
    method: "get",
    path: "/api/trace/backward",
    tag: "Trace",
    summary:
      "What is in a product lot, a tank at a time, a shipment or a batch: grams and % by feedstock lot, pickup, source, material kind and certification (each table adds up exactly to the traced mass), a feedstock-only view renormalised over feedstock, the reagents separately, every origin, a stage graph, and how fresh the server's ledger index is. Any signed-in user.",
    input: BackwardTraceQuerySchema,
  },
  {
    method: "get",
    path: "/api/trace/forward",
    tag: "Trace",
    summary:
      "Where the material of a source, a pickup or a feedstock lot went: every holder that received part of it, with grams received and still held, and where it is now by stage (adds up to what entered). Any signed-in user.",
    input: ForwardTraceQuerySchema,
  },
  {
    method: "get",
    path: "/api/balance",
    tag: "Balance",
    summary:
      "Period mass balance of the site in whole grams: opening + receipts (feedstock, reagents) = shipments + disposals + recorded losses + closing + unaccounted, with closure % against editable warn/fail levels; batches finished in the period; the same per material kind; book stock against the latest tank gauges; the accounting period's close and reopen record. Any signed-in user.",
    input: BalanceQuerySchema,
  },
  {
    method: "get",
    path: "/api/custody",
    tag: "Balance",
    summary:
      "Chain of custody by mass balance under the active rule set (RULESET_EU_2022_996 with its sources and which values are from memory): certified inputs by characteristic set, conversion per batch at the measured ester ÷ oil yield, certified claims on shipments checked at every booking, running balances and carry-forward per balance period, and the bookings that exceeded the balance. Optionally tries a claim now (claimKg) without saving it. Any signed-in user.",
    input: CustodyQuerySchema,
  },
  {
    method: "get",
    path: "/api/waste/due",
    tag: "Waste",
    summary:
      "Waste containers on site with ignitable/corrosive flags and the date each must go under the US federal generator rules (generator category as given, else assumed LQG; local rules may be stricter and govern), and what falls due within `days` days by stream with totals in kg, L and US gal. Any signed-in user.",
    input: WasteDuePageQuerySchema,
  },
  {
    method: "post",
    path: "/api/periods/close",
    tag: "Balance",
    summary: "Close an accounting period that has ended; recorded with who, when and the note. Compliance only.",
    input: PeriodActionBodyDoc("Optional note, at most 500 characters (default: period end)").partial({ reason: true }),
    output: z.object({ id: z.number().int() }),
  },
  {
    method: "post",
    path: "/api/periods/reopen",
    tag: "Balance",
    summary:
      "Reopen a closed accounting period; the reason is required (at least 5 characters) and recorded with who and when. Compliance only.",
    input: PeriodActionBodyDoc("Why the period is reopened: 5 to 500 characters, required"),
    output: z.object({ id: z.number().int() }),
  },
];
