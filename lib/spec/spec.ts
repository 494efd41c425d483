// Product specifications: the built-in editions (data tables in ./editions) and the pure judgement of a
// product lot's results against one edition and grade (or a site's own copy of one).
//
// Boundary semantics: a result equal to a limit passes. The standards write limits as "max" / "min"
// ("0.50 max" = not more than 0.50), so a value on the limit conforms; only a value beyond it fails.
// Values are compared as entered — no rounding is applied before comparing.
import { BUILT_IN_SPECS } from "@/lib/spec/editions";

export type Verdict = "PASS" | "FAIL" | "REPORTED" | "NOT_JUDGED";

// The shapes of a specification live beside the schema that loads the edition tables (editions and
// the schema would otherwise import this file back); they are re-exported here for every reader.
export type { EitherOrRule, Spec, SpecProperty } from "@/lib/spec/spec.schema";
import type { EitherOrRule, Spec, SpecProperty } from "@/lib/spec/spec.schema";

export interface ResultIn {
  id: number;
  property: string;
  value: number;
  testedAt: Date;
  /** Set on a result that a later re-test replaced. */
  supersededBy?: number | null;
  /** Set on a re-test: the id of the result it replaces (either link is enough). */
  supersedes?: number | null;
}

export interface PropertyJudgement {
  property: SpecProperty;
  result: ResultIn | null;
  verdict: Verdict | "MISSING";
  limitText: string;
}

export interface RuleJudgement {
  rule: EitherOrRule;
  /** true: one alternative is met; false: every alternative tested and none met; null: not decided yet. */
  met: boolean | null;
  text: string;
}

export interface LotJudgement {
  properties: PropertyJudgement[];
  rules: RuleJudgement[];
  /** Keys of required properties without a result, and of either-or rules not yet decided. */
  missing: string[];
  /** Keys of properties that failed, and of either-or rules that every alternative failed. */
  failing: string[];
  releasable: boolean;
}

function fmt(n: number, decimals: number | undefined): string {
  const text = decimals === undefined ? String(n) : n.toFixed(decimals);
  return text.replace(/^-/, "−"); // a printed minus sign, as the standards write it
}

function withUnit(text: string, unit: string): string {
  return unit === "" ? text : `${text} ${unit}`;
}

/** The limit as a reader of the standard would write it: "≤ 0.50 mg KOH/g", "1.9 – 6.0 mm²/s", "No. 3 max". */
export function limitText(p: SpecProperty): string {
  if (p.kind === "report") return "report";
  if (p.kind === "class") return p.classMax === undefined ? "report" : `${p.classScale ?? "Class"} ${p.classMax} max`;
  const { min, max } = p;
  if (min !== undefined && max !== undefined)
    return withUnit(`${fmt(min, p.decimals)} – ${fmt(max, p.decimals)}`, p.unit);
  if (max !== undefined) return withUnit(`≤ ${fmt(max, p.decimals)}`, p.unit);
  if (min !== undefined) return withUnit(`≥ ${fmt(min, p.decimals)}`, p.unit);
  return "no limit";
}

function within(value: number, min: number | undefined, max: number | undefined): boolean {
  // Equal to a limit conforms: "max" means not more than, "min" not less than.
  return (min === undefined || value >= min) && (max === undefined || value <= max);
}

/** Judges one value against one property. A "report" property is recorded, not judged. */
export function judgeValue(p: SpecProperty, value: number): Verdict {
  if (!Number.isFinite(value)) return "NOT_JUDGED";
  if (p.kind === "report") return "REPORTED";
  if (p.kind === "class") {
    if (p.classMax === undefined) return "REPORTED";
    return value <= p.classMax ? "PASS" : "FAIL";
  }
  if (p.min === undefined && p.max === undefined) return "NOT_JUDGED";
  return within(value, p.min, p.max) ? "PASS" : "FAIL";
}

/** The result that counts for each property: the latest one no re-test replaced (ties: the higher id). */
export function currentResults(results: readonly ResultIn[]): Map<string, ResultIn> {
  const replaced = new Set<number>();
  for (const r of results) if (r.supersedes != null) replaced.add(r.supersedes);
  const current = new Map<string, ResultIn>();
  for (const r of results) {
    if (r.supersededBy != null || replaced.has(r.id)) continue;
    const prev = current.get(r.property);
    const later =
      prev === undefined ||
      r.testedAt.getTime() > prev.testedAt.getTime() ||
      (r.testedAt.getTime() === prev.testedAt.getTime() && r.id > prev.id);
    if (later) current.set(r.property, r);
  }
  return current;
}

function alternativeText(spec: Spec, alt: EitherOrRule["anyOf"][number]): string {
  const p = spec.properties.find((q) => q.key === alt.property);
  const label = p?.label ?? alt.property;
  const bound: SpecProperty = {
    key: alt.property,
    label,
    method: "",
    unit: p?.unit ?? "",
    kind: "limit",
    required: false,
    confidence: "published",
    ...(alt.min === undefined ? {} : { min: alt.min }),
    ...(alt.max === undefined ? {} : { max: alt.max }),
  };
  return `${label} ${limitText(bound)}`;
}

export function ruleText(spec: Spec, rule: EitherOrRule): string {
  return rule.anyOf.map((alt) => alternativeText(spec, alt)).join(" or ");
}

export function judgeRule(spec: Spec, rule: EitherOrRule, current: ReadonlyMap<string, ResultIn>): RuleJudgement {
  let untested = false;
  let met = false;
  for (const alt of rule.anyOf) {
    const r = current.get(alt.property);
    if (r === undefined) untested = true;
    else if (within(r.value, alt.min, alt.max)) met = true;
  }
  return { rule, met: met ? true : untested ? null : false, text: ruleText(spec, rule) };
}

/** Properties that appear in an either-or rule and are not required on their own. */
function ruleOnlyKeys(spec: Spec): Set<string> {
  const inRules = new Set(spec.rules.flatMap((r) => r.anyOf.map((a) => a.property)));
  return new Set(spec.properties.filter((p) => !p.required && inRules.has(p.key)).map((p) => p.key));
}

function ruleOnlyVerdict(spec: Spec, p: SpecProperty, r: ResultIn, rules: readonly RuleJudgement[]): Verdict {
  const own = judgeValue(p, r.value);
  if (own !== "FAIL") return own;
  // A failed alternative does not fail the lot when another alternative of the same rule is met.
  const settled = rules.some((j) => j.met === true && j.rule.anyOf.some((a) => a.property === p.key));
  return settled ? "REPORTED" : "FAIL";
}

/**
 * Judges a product lot's results against a specification. The latest non-superseded result of each
 * property counts; a property that is only part of a satisfied either-or rule is neither missing nor failing.
 */
export function judgeLot(spec: Spec, results: readonly ResultIn[]): LotJudgement {
  const current = currentResults(results);
  const rules = spec.rules.map((rule) => judgeRule(spec, rule, current));
  const ruleOnly = ruleOnlyKeys(spec);
  const missing: string[] = [];
  const failing: string[] = [];
  const properties = spec.properties.map((property): PropertyJudgement => {
    const result = current.get(property.key) ?? null;
    const text = limitText(property);
    if (result === null) {
      if (property.required) missing.push(property.key);
      return { property, result, verdict: property.required ? "MISSING" : "NOT_JUDGED", limitText: text };
    }
    const verdict = ruleOnly.has(property.key)
      ? ruleOnlyVerdict(spec, property, result, rules)
      : judgeValue(property, result.value);
    if (verdict === "FAIL" && !ruleOnly.has(property.key)) failing.push(property.key);
    return { property, result, verdict, limitText: text };
  });
  for (const j of rules) {
    if (j.met === null) missing.push(j.rule.key);
    if (j.met === false) failing.push(j.rule.key);
  }
  return { properties, rules, missing, failing, releasable: missing.length === 0 && failing.length === 0 };
}

export function listBuiltInSpecs(): Spec[] {
  return BUILT_IN_SPECS.map((s) => s);
}

export function getBuiltInSpec(key: string): Spec | null {
  return BUILT_IN_SPECS.find((s) => s.key === key) ?? null;
}

/** The edition part of a built-in key: "astm-d6751-23a/no-2-b-s15" → "astm-d6751-23a". */
export function editionOfKey(specKey: string): string {
  const slash = specKey.indexOf("/");
  return slash < 0 ? specKey : specKey.slice(0, slash);
}

/** Anchor of a property on the sources page, e.g. "astm-d6751-23a-acid-number" (pass spec.baseKey ?? spec.key). */
export function sourceAnchor(specKey: string, propertyKey: string): string {
  return `${editionOfKey(specKey)}-${propertyKey}`;
}
