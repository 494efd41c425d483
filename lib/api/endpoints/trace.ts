// Traceability, balances, chain of custody and waste-due endpoints: their query shapes (shared with
// the pages, which send the same query strings) and their documentation. The answers come from the
// services the pages use (lib/trace/trace.service, lib/mass-balance/balance.service,
// lib/custody/custody.service, app/waste/due/due-report), so page and API reconcile exactly.
import { z } from "zod";
import type { EndpointDoc } from "@/lib/api/openapi";
import { OPERATOR_TYPES } from "@/lib/custody/custody-balance";
import { MAX_SET_KEY_LENGTH } from "@/lib/custody/custody.schema";
import { code, MAX_MASS_KG, oneOf, when } from "@/lib/ledger/fields";
import { MAX_PERIOD_YEAR, MAX_TOLERANCE_PCT, MIN_PERIOD_YEAR, MIN_TOLERANCE_PCT } from "@/lib/mass-balance/period.schema";
import { GENERATOR_CATEGORIES } from "@/lib/waste/waste.schema";

/** Query strings send "" for an empty field. */
const blank = (v: unknown) => (v === "" || v === null ? undefined : v);

// ---- trace ---------------------------------------------------------------------------------------

export const BACKWARD_KINDS = ["PRODUCT_LOT", "TANK", "SHIPMENT", "BATCH"] as const;
export type BackwardKind = (typeof BACKWARD_KINDS)[number];
export const FORWARD_KINDS = ["SOURCE", "PICKUP", "LOT"] as const;
export type ForwardKind = (typeof FORWARD_KINDS)[number];

export const BackwardTraceQuerySchema = z.object({
  kind: oneOf("What to trace", BACKWARD_KINDS),
  /** A product lot, tank or batch code, or a shipment's document number. */
  code: code("Code"),
  /** Tanks only: the moment to look into the tank (ISO date-time with zone); default: after the last movement. */
  at: z.preprocess(blank, when("Tank time").optional()),
});
export type BackwardTraceQuery = z.output<typeof BackwardTraceQuerySchema>;

export const ForwardTraceQuerySchema = z.object({
  kind: oneOf("What to follow", FORWARD_KINDS),
  code: code("Code"),
});
export type ForwardTraceQuery = z.output<typeof ForwardTraceQuerySchema>;

// ---- balance -------------------------------------------------------------------------------------

export const BALANCE_PERIOD_KINDS = ["MONTH", "QUARTER", "CUSTOM"] as const;

const wholeNumber = (what: string, min: number, max: number) =>
  z.preprocess(blank, z.coerce.number({ error: `${what} must be a number` }).int(`${what} must be a whole number`).min(min, `${what} must be ${min}–${max}`).max(max, `${what} must be ${min}–${max}`).optional());
const tolerancePct = (what: string) =>
  z.preprocess(
    blank,
    z.coerce
      .number({ error: `${what} (% of inputs) must be a number` })
      .min(MIN_TOLERANCE_PCT, `${what} must be at least ${MIN_TOLERANCE_PCT} %`)
      .max(MAX_TOLERANCE_PCT, `${what} must be at most ${MAX_TOLERANCE_PCT} %`)
      .optional(),
  );
const isoDay = (what: string) => z.preprocess(blank, z.string().regex(/^\d{4}-\d{2}-\d{2}$/, `${what} must be a date written YYYY-MM-DD`).optional());

/**
 * The balance page's form and GET /api/balance. Without a period, the last full calendar month.
 * CUSTOM runs from `start` (inclusive) to `end` (exclusive), both local dates of the site.
 * Without warnPct/failPct the common-practice defaults apply (DEFAULT_CLOSURE_TOLERANCE).
 */
export const BalanceQuerySchema = z.object({
  period: z.preprocess(blank, oneOf("Period", BALANCE_PERIOD_KINDS).default("MONTH")),
  year: wholeNumber("Year", MIN_PERIOD_YEAR, MAX_PERIOD_YEAR),
  month: wholeNumber("Month", 1, 12),
  quarter: wholeNumber("Quarter", 1, 4),
  start: isoDay("Start date"),
  end: isoDay("End date (first day after the period)"),
  warnPct: tolerancePct("Warn level"),
  failPct: tolerancePct("Fail level"),
});
export type BalanceQuery = z.output<typeof BalanceQuerySchema>;

// ---- chain of custody ----------------------------------------------------------------------------

export const CustodyQuerySchema = z.object({
  /** A balance period label, e.g. "2026-Q4"; default: the period containing today. */
  period: z.preprocess(blank, z.string().trim().regex(/^\d{4}(-Q[1-4]|-\d{2})?$|^\d{4}-\d{2}-\d{2}\.\.\d{4}-\d{2}-\d{2}$/, "Period: a balance period label such as 2026-Q4").optional()),
  operatorType: z.preprocess(blank, z.enum(OPERATOR_TYPES, { error: `Operator type must be one of: ${OPERATOR_TYPES.join(", ")}` }).default("OTHER_OPERATOR")),
  /** Try a certified claim of this many kg of methyl ester now, without saving it. */
  claimKg: z.preprocess(
    blank,
    z.coerce.number({ error: "Claim (kg) must be a number" }).positive("Claim (kg) must be more than 0").max(MAX_MASS_KG, `Claim must be at most ${MAX_MASS_KG.toLocaleString("en")} kg`).optional(),
  ),
  claimSet: z.preprocess(blank, z.string().trim().max(MAX_SET_KEY_LENGTH, `Characteristic set: at most ${MAX_SET_KEY_LENGTH} characters`).optional()),
});
export type CustodyQuery = z.output<typeof CustodyQuerySchema>;

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
  tsdfMiles: z.preprocess(blank, z.coerce.number({ error: "Distance to the treatment facility (miles) must be a number" }).optional()),
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
    summary: "Where the material of a source, a pickup or a feedstock lot went: every holder that received part of it, with grams received and still held, and where it is now by stage (adds up to what entered). Any signed-in user.",
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
    summary: "Reopen a closed accounting period; the reason is required (at least 5 characters) and recorded with who and when. Compliance only.",
    input: PeriodActionBodyDoc("Why the period is reopened: 5 to 500 characters, required"),
    output: z.object({ id: z.number().int() }),
  },
];
