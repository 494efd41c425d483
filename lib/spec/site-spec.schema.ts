// A site's own specification: a copy of a built-in edition and grade with some limits changed (a
// buyer's tighter water limit, a climate class for the cold-filter plugging point). Shared by the
// form's action, the JSON route and the service.
import { z } from "zod";
import { id, requiredText } from "@/lib/core/fields";

export const MAX_SITE_SPEC_NAME = 80;

const limitValue = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .finite(`${what} must be a number`)
    .nullable()
    .default(null);

/** The limits of one property as the site wants them; null = no limit on that side. */
export const SiteLimitSchema = z.object({ min: limitValue("Lower limit"), max: limitValue("Upper limit") }).strict();
export type SiteLimit = z.output<typeof SiteLimitSchema>;

/** Changed limits by property key, as stored in SiteSpec.limitsJson. */
export const SiteLimitsSchema = z.record(
  z.string().regex(/^[a-z0-9-]{1,60}$/, "Property: unknown property"),
  SiteLimitSchema,
);
export type SiteLimits = z.output<typeof SiteLimitsSchema>;

export const SiteSpecInputSchema = z.object({
  baseKey: z
    .string({ error: "Copied from: choose a specification edition and grade" })
    .min(1, "Copied from: choose a specification edition and grade")
    .max(80, "Copied from: choose a specification edition and grade"),
  name: requiredText("Name", MAX_SITE_SPEC_NAME),
  customerId: id("Customer").optional(),
  /** The version this change starts from; absent when the name is new (version 1). */
  previousVersion: z.number({ error: "Version must be a number" }).int().min(1).optional(),
  limits: SiteLimitsSchema.default({}),
  reason: requiredText("Reason", 300).refine(
    (r) => r.length >= 3,
    "Reason: say in a few words why the site needs its own limits (at least 3 characters)",
  ),
});
export type SiteSpecInput = z.input<typeof SiteSpecInputSchema>;
export type SiteSpecParsed = z.output<typeof SiteSpecInputSchema>;

/** Key of one stored site specification version, resolved by getSpecByKey. */
export function siteSpecKey(siteSpecId: number): string {
  return `site:${siteSpecId}`;
}

export function parseSiteSpecKey(key: string): number | null {
  const m = /^site:(\d{1,10})$/.exec(key);
  if (!m?.[1]) return null;
  const n = Number(m[1]);
  return n >= 1 && n <= 2_147_483_647 ? n : null;
}
