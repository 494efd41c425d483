import { toNumber } from "@/app/_ui/kit/form-state";
import type { SearchParams } from "@/app/_ui/links";

export type { SearchParams };

/** Number fields of the planning form, in the order they appear. */
export const PLAN_NUMBER_FIELDS = [
  "targetOilKg",
  "maxFfaPct",
  "maxWaterPct",
  "minDrawKg",
  "assayPct",
  "molarRatio",
  "reactionTempC",
  "baseDosePctOfOil",
  "meanTgMolarMass",
  "saponificationValueMgKohG",
  "washes",
  "waterPerWashPctOfEster",
  "acidMethanolToFfaRatio",
  "acidPctOfFfa",
  "acidPurityPct",
  "residualFfaPct",
  "defaultCostPerKg",
] as const;
export const PLAN_TEXT_FIELDS = ["objective", "catalyst"] as const;

function first(v: string | string[] | undefined): string {
  return (Array.isArray(v) ? v[0] : v)?.trim() ?? "";
}

function all(v: string | string[] | undefined): string[] {
  return (Array.isArray(v) ? v : v === undefined ? [] : [v]).map((x) => x.trim()).filter((x) => x !== "");
}

/** The planning form's query → the request for BatchPlanRequestSchema (empty fields take the defaults). */
export function planRequestFromParams(params: SearchParams): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const name of PLAN_NUMBER_FIELDS) {
    const n = toNumber(first(params[name]));
    if (n !== undefined) out[name] = n;
  }
  for (const name of PLAN_TEXT_FIELDS) {
    const t = first(params[name]);
    if (t !== "") out[name] = t;
  }
  const costs: Record<string, number | undefined> = {};
  for (const [key, value] of Object.entries(params)) {
    if (!key.startsWith("cost.")) continue;
    const n = toNumber(first(value));
    if (n !== undefined) costs[key.slice(5)] = n;
  }
  out.costs = costs;
  out.exclude = all(params.exclude);
  return out;
}

/** The same query as a string, for the printable card link and the record form. */
export function planQueryString(params: SearchParams): string {
  const q = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (key === "code" || key === "notes") continue;
    for (const v of all(value)) q.append(key, v);
  }
  return q.toString();
}

export function paramsFromQueryString(query: string): SearchParams {
  const out: Record<string, string[]> = {};
  for (const [k, v] of new URLSearchParams(query)) (out[k] ??= []).push(v);
  return out;
}

export function firstParam(params: SearchParams, name: string): string {
  return first(params[name]);
}
