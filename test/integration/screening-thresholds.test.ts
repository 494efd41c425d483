import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { saveSourceProfile } from "@/lib/screening/decision.service";
import { runScreen } from "@/lib/screening/screening.service";
import { listFlags } from "@/lib/screening/screening.store";
import { changeScreeningSetting, getScreeningSettings } from "@/lib/screening/screening-settings.service";
import { listScreeningSettingChanges } from "@/lib/screening/screening-settings.store";

// A site's own threshold is what its screens run with: 130 L in a month against a declared 100 L is
// 1.3×, under the default 1.5× and over a site's 1.2×.
describe.each(PROVIDERS)("source check thresholds set by the site on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    const profile = await saveSourceProfile(t.db, plant.compliance, {
      sourceCode: "R1",
      kind: "RESTAURANT",
      capacityBasis: "MONTHLY",
      declaredLitresPerMonth: 100,
      capacityDeclaredAt: "2026-01-05T00:00:00Z",
      capacityDeclaredBy: "the kitchen's manager",
    });
    expect(profile.ok).toBe(true);
    for (const [i, volumeL] of [60, 70].entries()) {
      const r = await recordPickup(t.db, plant.collector, {
        code: `PU-TH-${i}`,
        sourceCode: "R1",
        material: "USED_COOKING_OIL",
        observedAt: `2026-02-${10 + i * 10}T10:00:00Z`,
        containers: 1,
        volumeL,
        tempC: 18,
      });
      expect(r.ok).toBe(true);
    }
  });
  afterAll(async () => {
    await t.drop();
  });

  const screen = () =>
    runScreen(t.db, plant.compliance, null, new Date("2026-01-01T00:00:00Z"), new Date("2026-03-01T00:00:00Z"));
  const capacityFlags = async () =>
    (await listFlags(t.db, plant.siteId)).filter((f) => f.signal === "OVER_CAPACITY").map((f) => f.message);

  it("flags nothing at the default, and flags the month once the site sets 1.2×", async () => {
    await screen();
    expect(await capacityFlags()).toEqual([]);
    const changed = await changeScreeningSetting(t.db, plant.compliance, {
      setting: "capacityRatio",
      value: 1.2,
      reason: "our kitchens declare generously",
    });
    expect(changed.ok).toBe(true);
    expect((await getScreeningSettings(t.db, plant.siteId)).capacityRatio.value).toBe(1.2);
    await screen();
    expect(await capacityFlags()).toEqual([
      expect.stringMatching(
        /^130 L in February 2026 against a declared 100 L\/month: 1\.3× \(flagged above 1\.2×\)\.$/,
      ),
    ]);
    const history = await listScreeningSettingChanges(t.db, plant.siteId);
    expect(history.map((h) => [h.reason, h.values])).toEqual([
      ["our kitchens declare generously", { capacityRatio: 1.2 }],
    ]);
    const audit = await t.db.auditEvent.findMany({ where: { entity: "ScreeningThreshold" } });
    expect(audit).toHaveLength(1);
  });

  it("refuses a value out of range or a density range turned inside out, naming the field, saving nothing", async () => {
    const before = (await listScreeningSettingChanges(t.db, plant.siteId)).length;
    const far = await changeScreeningSetting(t.db, plant.compliance, { setting: "robustZ", value: 40, reason: "x" });
    expect(far.ok ? null : far.issues[0]).toMatchObject({
      field: "value",
      message: "New value must be between 1 and 10",
    });
    const noReason = await changeScreeningSetting(t.db, plant.compliance, { setting: "robustZ", value: 4, reason: "" });
    expect(noReason.ok ? null : noReason.issues[0]?.field).toBe("reason");
    const inside = await changeScreeningSetting(t.db, plant.compliance, {
      setting: "densityMinKgM3",
      value: 940,
      reason: "typing slip",
    });
    expect(inside.ok ? null : inside.issues[0]).toMatchObject({ code: "SCREENING.SETTING_RANGE", field: "value" });
    expect((await listScreeningSettingChanges(t.db, plant.siteId)).length).toBe(before);
  });
});
