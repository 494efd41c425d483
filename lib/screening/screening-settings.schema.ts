import { z } from "zod";
import { oneOf, requiredText } from "@/lib/core/fields";
import { SCREENING_SETTING_KEYS } from "@/lib/screening/screening-defaults";
import type { ScreeningSettingKey } from "@/lib/screening/screening-defaults";

/** What a site may set each threshold to: wide enough for any plant, narrow enough to catch a typing slip. */
export const SCREENING_SETTING_RANGES: Readonly<
  Record<ScreeningSettingKey, { min: number; max: number; whole?: boolean }>
> = {
  capacityRatio: { min: 1, max: 20 },
  robustZ: { min: 1, max: 10 },
  madFloorShare: { min: 0, max: 1 },
  minHistory: { min: 2, max: 60, whole: true },
  minPeers: { min: 2, max: 100, whole: true },
  freshAcidValue: { min: 0, max: 5 },
  waterExcessPct: { min: 0, max: 50 },
  insolublesExcessPct: { min: 0, max: 50 },
  densityMinKgM3: { min: 800, max: 1000 },
  densityMaxKgM3: { min: 800, max: 1000 },
  shiftRatio: { min: 1, max: 20 },
  shiftWindow: { min: 2, max: 24, whole: true },
  intervalMinDays: { min: 1, max: 60 },
  hoursMargin: { min: 0, max: 12 },
  certificateMonths: { min: 1, max: 60, whole: true },
};

/** One threshold changed on the source checks' thresholds page, with the reason the site gives. */
export const ScreeningSettingChangeSchema = z
  .object({
    setting: oneOf("Threshold", SCREENING_SETTING_KEYS),
    value: z.number({ error: "New value must be a number" }),
    reason: requiredText("Reason", 500),
  })
  .superRefine((c, ctx) => {
    const r = SCREENING_SETTING_RANGES[c.setting];
    if (c.value < r.min || c.value > r.max)
      ctx.addIssue({ code: "custom", path: ["value"], message: `New value must be between ${r.min} and ${r.max}` });
    else if (r.whole && !Number.isInteger(c.value))
      ctx.addIssue({ code: "custom", path: ["value"], message: "New value must be a whole number" });
  });
export type ScreeningSettingChange = z.infer<typeof ScreeningSettingChangeSchema>;

/** What is stored per change: every value the site has set so far (the newest row counts). */
export const StoredScreeningSettingsSchema = z.object({
  values: z.partialRecord(z.enum(SCREENING_SETTING_KEYS), z.number()),
});
export type StoredScreeningSettings = z.infer<typeof StoredScreeningSettingsSchema>;
