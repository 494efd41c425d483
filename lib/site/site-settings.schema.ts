import { z } from "zod";
import { GS1_PREFIX_MAX_DIGITS, GS1_PREFIX_MIN_DIGITS } from "@/lib/labels/gs1";

/** The GS1 Company Prefix the plant licenses; empty means "we have none" and exports use the site's own identifiers. */
export const SiteGs1Schema = z.object({
  gs1CompanyPrefix: z
    .string({ error: "GS1 Company Prefix must be text" })
    .trim()
    .regex(
      new RegExp(`^(\\d{${GS1_PREFIX_MIN_DIGITS},${GS1_PREFIX_MAX_DIGITS}})?$`),
      `GS1 Company Prefix: ${GS1_PREFIX_MIN_DIGITS} to ${GS1_PREFIX_MAX_DIGITS} digits as licensed to the plant, or leave it empty`,
    )
    .transform((v) => (v === "" ? null : v)),
  reason: z
    .string({ error: "Reason is required" })
    .trim()
    .min(5, "Reason: say why the prefix changes (at least 5 characters)")
    .max(200, "Reason: at most 200 characters"),
});
export type SiteGs1Input = z.input<typeof SiteGs1Schema>;
