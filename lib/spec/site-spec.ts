// Pure rules of site specifications: which typed limits differ from the base, whether a change would
// loosen a published limit, and the Spec a stored version resolves to.
import type { DomainIssue } from "@/lib/core/result";
import { limitText } from "@/lib/spec/spec";
import type { Spec, SpecProperty } from "@/lib/spec/spec";
import type { SiteLimit, SiteLimits } from "@/lib/spec/site-spec.schema";

/** A property's limits in the site form's terms: a class scale's worst class is its upper limit. */
export function limitsOf(p: SpecProperty): SiteLimit {
  if (p.kind === "class") return { min: null, max: p.classMax ?? null };
  if (p.kind === "report") return { min: null, max: null };
  return { min: p.min ?? null, max: p.max ?? null };
}

/** Only the limits that differ from the spec they start from. */
export function changedLimits(from: Spec, typed: SiteLimits): SiteLimits {
  const out: SiteLimits = {};
  for (const [key, lim] of Object.entries(typed)) {
    const p = from.properties.find((q) => q.key === key);
    if (p === undefined) continue;
    const now = limitsOf(p);
    if (now.min !== lim.min || now.max !== lim.max) out[key] = lim;
  }
  return out;
}

function decimalsOf(n: number | null): number {
  if (n === null) return 0;
  const s = String(n);
  const dot = s.indexOf(".");
  return dot < 0 || s.includes("e") ? 0 : s.length - dot - 1;
}

/**
 * A site specification may tighten a published limit or add one to a reported property, never loosen
 * or remove one: a lot released against it must still meet the edition it was copied from.
 */
export function siteLimitIssues(base: Spec, limits: SiteLimits): DomainIssue[] {
  const issues: DomainIssue[] = [];
  for (const [key, lim] of Object.entries(limits)) {
    const p = base.properties.find((q) => q.key === key);
    const field = `limits.${key}.max`;
    if (p === undefined) {
      issues.push({
        code: "SITESPEC.UNKNOWN_PROPERTY",
        message: `${key}: not a property of ${base.edition} ${base.grade}`,
        field,
      });
      continue;
    }
    const published = limitsOf(p);
    const shown = `${p.label}: the published limit is ${limitText(p)}; a site specification may tighten it, not loosen or remove it`;
    if (published.min !== null && (lim.min === null || lim.min < published.min))
      issues.push({ code: "SITESPEC.LOOSER", message: shown, field: `limits.${key}.min` });
    if (published.max !== null && (lim.max === null || lim.max > published.max))
      issues.push({ code: "SITESPEC.LOOSER", message: shown, field });
    if (p.kind === "class" && lim.min !== null)
      issues.push({
        code: "SITESPEC.CLASS_MIN",
        message: `${p.label}: give only the worst class accepted`,
        field: `limits.${key}.min`,
      });
    if (p.kind === "class" && lim.max !== null && (!Number.isInteger(lim.max) || lim.max < 1))
      issues.push({
        code: "SITESPEC.CLASS_NUMBER",
        message: `${p.label}: the worst class accepted is a whole number such as 1`,
        field,
      });
    if (lim.min !== null && lim.max !== null && lim.min > lim.max)
      issues.push({
        code: "SITESPEC.MIN_ABOVE_MAX",
        message: `${p.label}: the lower limit is above the upper limit`,
        field: `limits.${key}.min`,
      });
  }
  return issues;
}

function applyOne(p: SpecProperty, lim: SiteLimit): SpecProperty {
  if (p.kind === "class") return { ...p, ...(lim.max === null ? {} : { classMax: lim.max }), siteLimit: true };
  const { min: _min, max: _max, ...rest } = p;
  const decimals = Math.max(p.decimals ?? 0, decimalsOf(lim.min), decimalsOf(lim.max));
  const kind = lim.min === null && lim.max === null ? p.kind : "limit";
  return {
    ...rest,
    kind,
    ...(lim.min === null ? {} : { min: lim.min }),
    ...(lim.max === null ? {} : { max: lim.max }),
    ...(decimals > 0 ? { decimals } : {}),
    siteLimit: true,
  };
}

export interface SiteSpecMeta {
  key: string;
  name: string;
  version: number;
  reason: string;
}

/** The Spec a stored site specification version resolves to: the base with the site's limits applied. */
export function applySiteLimits(base: Spec, limits: SiteLimits, meta: SiteSpecMeta): Spec {
  return {
    ...base,
    key: meta.key,
    title: `${meta.name} (version ${meta.version})`,
    baseKey: base.key,
    siteSpec: { name: meta.name, version: meta.version, reason: meta.reason },
    properties: base.properties.map((p) => {
      const lim = limits[p.key];
      return lim === undefined ? p : applyOne(p, lim);
    }),
  };
}

/** "Water and sediment ≤ 0.03 % volume; …" — the limits a site specification changed. */
export function siteLimitsText(spec: Spec): string {
  const changed = spec.properties.filter((p) => p.siteLimit);
  return changed.length === 0
    ? "same limits as the edition"
    : changed.map((p) => `${p.label} ${limitText(p)}`).join("; ");
}
