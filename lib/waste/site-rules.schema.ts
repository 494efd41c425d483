import { z } from "zod";
import { oneOf, requiredText, text } from "@/lib/core/fields";
import { GENERATOR_CATEGORIES, MAX_TSDF_DISTANCE_MILES } from "@/lib/waste/waste.schema";

/** US federal categories as written, or the site's own named set built on one of them. */
export const WASTE_RULE_CHOICES = ["US_FEDERAL", "SITE_OWN"] as const;
export const MAX_RULE_DAYS = 3650;
export const MAX_SATELLITE_US_GAL = 10_000;

const days = (what: string) =>
  z
    .number({ error: `${what} (days) must be a number` })
    .int(`${what} must be whole days`)
    .min(1, `${what} must be at least 1 day`)
    .max(MAX_RULE_DAYS, `${what} must be at most ${MAX_RULE_DAYS} days`)
    .optional();

/** The waste rules a site works to, as an administrator or compliance officer chooses them on screen. */
export const SiteWasteRulesSchema = z
  .object({
    choice: oneOf("Rule set", WASTE_RULE_CHOICES),
    generatorCategory: oneOf("Generator category", GENERATOR_CATEGORIES),
    tsdfDistanceMiles: z
      .number({ error: "Distance to the treatment facility (miles) must be a number" })
      .min(0, "Distance to the treatment facility must be at least 0 miles")
      .max(
        MAX_TSDF_DISTANCE_MILES,
        `Distance to the treatment facility must be at most ${MAX_TSDF_DISTANCE_MILES} miles`,
      )
      .nullable()
      .default(null),
    /** For the site's own set: its name (e.g. the state or country rule it follows). */
    name: text("Rule set name", 120).default(""),
    hazardousMaxDays: days("Longest accumulation of hazardous waste"),
    nonHazardousMaxDays: days("Longest storage of non-hazardous waste"),
    satelliteExcessDays: days("Days to move a satellite excess"),
    satelliteMaxUsGal: z
      .number({ error: "Satellite limit (US gal) must be a number" })
      .gt(0, "Satellite limit must be more than 0 US gal")
      .max(MAX_SATELLITE_US_GAL, `Satellite limit must be at most ${MAX_SATELLITE_US_GAL} US gal`)
      .optional(),
    reason: requiredText("Reason", 500),
  })
  .superRefine((r, ctx) => {
    if (r.choice !== "SITE_OWN") return;
    if (r.name.trim() === "")
      ctx.addIssue({
        code: "custom",
        message: "Name the site's own rule set (e.g. the rule it follows)",
        path: ["name"],
      });
    if (
      [r.hazardousMaxDays, r.nonHazardousMaxDays, r.satelliteExcessDays, r.satelliteMaxUsGal].every(
        (v) => v === undefined,
      )
    ) {
      ctx.addIssue({
        code: "custom",
        message: "Give at least one limit of the site's own rule set",
        path: ["hazardousMaxDays"],
      });
    }
  });
export type SiteWasteRulesInput = z.input<typeof SiteWasteRulesSchema>;
export type SiteWasteRules = z.output<typeof SiteWasteRulesSchema>;
