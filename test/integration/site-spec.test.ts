import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { getSpecByKey, listSiteSpecViews, listSpecChoices, saveSiteSpec } from "@/lib/spec/site-spec.service";
import { judgeLot } from "@/lib/spec/spec";
import { listRecordHistory } from "@/lib/audit/audit.store";
import type { Result } from "@/lib/core/result";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}
function issue<T>(r: Result<T>): { code: string; field?: string } {
  if (r.ok) throw new Error("expected a refusal");
  return { code: r.issues[0]?.code ?? "", ...(r.issues[0]?.field === undefined ? {} : { field: r.issues[0].field }) };
}

const BASE = "astm-d6751-23a/no-2-b-s15";

describe.each(PROVIDERS)("site specifications on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
  });
  afterAll(async () => {
    await t.drop();
  });

  it("copies a built-in grade with a tighter water limit (version 1) and resolves its key", async () => {
    // ASTM D6751-23a Table 1: water and sediment 0.050 % volume max; the buyer wants 0.030.
    const v1 = value(
      await saveSiteSpec(t.db, plant.compliance, {
        baseKey: BASE,
        name: "Buyer tighter water",
        limits: { "water-sediment": { min: null, max: 0.03 }, "acid-number": { min: null, max: 0.5 } },
        reason: "Buyer contract clause 4",
      }),
    );
    expect(v1).toMatchObject({ name: "Buyer tighter water", version: 1, key: `site:${v1.id}` });
    const spec = await getSpecByKey(t.db, plant.siteId, v1.key);
    expect(spec?.baseKey).toBe(BASE);
    expect(spec?.siteSpec).toEqual({ name: "Buyer tighter water", version: 1, reason: "Buyer contract clause 4" });
    const water = spec?.properties.find((p) => p.key === "water-sediment");
    expect(water).toMatchObject({ max: 0.03, siteLimit: true });
    // Only the changed limit is stored; the unchanged acid number stays the edition's own.
    const row = await t.db.siteSpec.findUniqueOrThrow({ where: { id: v1.id } });
    expect(JSON.parse(row.limitsJson)).toEqual({ "water-sediment": { min: null, max: 0.03 } });
    expect(spec?.properties.find((p) => p.key === "acid-number")?.siteLimit).toBeUndefined();
    // A lot at 0.040 % volume meets the edition but not the buyer's copy.
    const builtIn = await getSpecByKey(t.db, plant.siteId, BASE);
    const results = [{ id: 1, property: "water-sediment", value: 0.04, testedAt: new Date("2026-03-01T08:00:00Z") }];
    expect(judgeLot(builtIn!, results).failing).not.toContain("water-sediment");
    expect(judgeLot(spec!, results).failing).toContain("water-sediment");
  });

  it("makes version 2 from version 1 and keeps version 1 unchanged", async () => {
    const v2 = value(
      await saveSiteSpec(t.db, plant.compliance, {
        baseKey: BASE,
        name: "Buyer tighter water",
        previousVersion: 1,
        limits: { "water-sediment": { min: null, max: 0.025 } },
        reason: "Buyer tightened again",
      }),
    );
    expect(v2.version).toBe(2);
    const views = await listSiteSpecViews(t.db, plant.siteId);
    expect(views.map((v) => [v.row.version, v.row.limits["water-sediment"]?.max])).toEqual([
      [1, 0.03],
      [2, 0.025],
    ]);
    const history = await listRecordHistory(t.db, plant.siteId, "SiteSpec", "Buyer tighter water");
    expect(history.map((h) => h.action)).toEqual(["CREATE", "CHANGE"]);
  });

  it("refuses a stale version, a taken name, no change, a looser limit and a missing reason", async () => {
    const again = {
      baseKey: BASE,
      name: "Buyer tighter water",
      limits: { "water-sediment": { min: null, max: 0.02 } },
      reason: "Third change",
    };
    expect(issue(await saveSiteSpec(t.db, plant.compliance, { ...again, previousVersion: 1 }))).toEqual({
      code: "SITESPEC.STALE",
      field: "name",
    });
    expect(issue(await saveSiteSpec(t.db, plant.compliance, again))).toEqual({
      code: "SITESPEC.NAME_TAKEN",
      field: "name",
    });
    expect(
      issue(
        await saveSiteSpec(t.db, plant.compliance, {
          ...again,
          previousVersion: 2,
          limits: { "water-sediment": { min: null, max: 0.025 } },
        }),
      ),
    ).toEqual({ code: "SITESPEC.NO_CHANGE", field: "reason" });
    // ASTM D6751-23a Table 1: 0.050 % volume max — a site copy cannot loosen it.
    expect(
      issue(
        await saveSiteSpec(t.db, plant.compliance, {
          ...again,
          name: "Looser",
          limits: { "water-sediment": { min: null, max: 0.06 } },
        }),
      ),
    ).toEqual({ code: "SITESPEC.LOOSER", field: "limits.water-sediment.max" });
    expect(issue(await saveSiteSpec(t.db, plant.compliance, { ...again, name: "No reason", reason: "" }))).toEqual({
      code: "INPUT.INVALID",
      field: "reason",
    });
    expect(issue(await saveSiteSpec(t.db, plant.compliance, { ...again, name: "Bad base", baseKey: "nope" }))).toEqual({
      code: "SITESPEC.UNKNOWN_BASE",
      field: "baseKey",
    });
    expect(await t.db.siteSpec.count()).toBe(2);
  });

  it("gives a climate class to a reported property (EN 14214 CFPP) and resolves only the site's own keys", async () => {
    const s = value(
      await saveSiteSpec(t.db, plant.compliance, {
        baseKey: "en-14214-2019/fame",
        name: "Winter grade",
        limits: { cfpp: { min: null, max: -10 } },
        reason: "Winter deliveries, site climate class",
      }),
    );
    const spec = await getSpecByKey(t.db, plant.siteId, s.key);
    expect(spec?.properties.find((p) => p.key === "cfpp")).toMatchObject({ kind: "limit", max: -10 });
    expect(await getSpecByKey(t.db, plant.siteId + 1000, s.key)).toBeNull();
    expect(await getSpecByKey(t.db, plant.siteId, "site:999999")).toBeNull();
    expect(await getSpecByKey(t.db, plant.siteId, "site:abc")).toBeNull();
    // The choice list offers the built-in grades and the current version of each site specification.
    const choices = await listSpecChoices(t.db, plant.siteId);
    expect(choices.filter((c) => c.key.startsWith("site:")).map((c) => c.label)).toEqual([
      "Buyer tighter water (site, version 2)",
      "Winter grade (site, version 1)",
    ]);
    expect(choices).toHaveLength(7 + 2);
  });
});
