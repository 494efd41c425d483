// The thresholds a screen runs with: the sourced defaults, with any value the site has set in their place.
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";
import {
  DEFAULT_SCREENING_SETTINGS,
  SCREENING_SETTING_KEYS,
  SCREENING_SETTING_LABELS,
} from "@/lib/screening/screening-defaults";
import type { ScreeningSettingKey, ScreeningSettings } from "@/lib/screening/screening-defaults";
import type { ScreeningSettingChange, StoredScreeningSettings } from "@/lib/screening/screening-settings.schema";

export function applySiteSettings(
  stored: StoredScreeningSettings,
  defaults = DEFAULT_SCREENING_SETTINGS,
): ScreeningSettings {
  const out = { ...defaults };
  for (const key of SCREENING_SETTING_KEYS) {
    const v = stored.values[key];
    if (v !== undefined && v !== defaults[key].value)
      out[key] = { ...defaults[key], value: v, note: `set by this site; the default is ${defaults[key].value}` };
  }
  return out;
}

/**
 * The stored values after one change. A value equal to the default drops the site's own value; the
 * density range must stay a range.
 */
export function withChange(
  stored: StoredScreeningSettings,
  change: ScreeningSettingChange,
  defaults = DEFAULT_SCREENING_SETTINGS,
): Result<StoredScreeningSettings> {
  const values: Partial<Record<ScreeningSettingKey, number>> = { ...stored.values };
  if (change.value === defaults[change.setting].value) delete values[change.setting];
  else values[change.setting] = change.value;
  const min = values.densityMinKgM3 ?? defaults.densityMinKgM3.value;
  const max = values.densityMaxKgM3 ?? defaults.densityMaxKgM3.value;
  if (min >= max)
    return fail(
      "SCREENING.SETTING_RANGE",
      `New value: ${SCREENING_SETTING_LABELS.densityMinKgM3.toLowerCase()} (${min}) must stay below ${SCREENING_SETTING_LABELS.densityMaxKgM3.toLowerCase()} (${max})`,
      "value",
    );
  return ok({ values });
}
