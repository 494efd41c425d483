import { describe, expect, it } from "vitest";
import {
  LOCAL_RULES_NOTE,
  RULESET_US_FEDERAL_RCRA,
  assessWasteHazards,
  computeWasteDue,
  getSatelliteLimitMl,
  listWasteDue,
} from "@/lib/waste/waste-due";
import type { WasteCharacterisation, WasteContainerInput, WasteSite } from "@/lib/waste/waste-due";
import type { WasteStream } from "@/lib/core/vocabulary";

const utc = (iso: string): number => Date.parse(iso);
const DAY = 86_400_000;

const liquidNonAqueous: WasteCharacterisation = { aqueous: false, pH: 7 };

describe("ignitability D001", () => {
  it.each([
    { name: "flash point 59.9 °C → ignitable", c: { ...liquidNonAqueous, flashPointC: 59.9 }, status: "YES" }, // 40 CFR 261.21(a)(1)
    { name: "flash point 60 °C → not ignitable", c: { ...liquidNonAqueous, flashPointC: 60 }, status: "NO" }, // 40 CFR 261.21(a)(1)
    {
      name: "methanol-rich liquid at methanol's flash point 11 °C → ignitable",
      c: { ...liquidNonAqueous, flashPointC: 11 },
      status: "YES",
    }, // methanol flash point 11 °C closed cup (Engineering Toolbox, 40 CFR 261)
    { name: "ester-like liquid at 130 °C → not ignitable", c: { ...liquidNonAqueous, flashPointC: 130 }, status: "NO" }, // D6751 alcohol control flash point 130 °C (ASTM D6751-23a)
    {
      name: "aqueous with 23.9 % alcohol by volume, flash 30 °C → excluded",
      c: { aqueous: true, methanolPct: 23.9, flashPointC: 30, pH: 7 },
      status: "NO",
    }, // 40 CFR 261.21(a)(1) aqueous < 24 % alcohol exclusion
    {
      name: "aqueous with 24 % alcohol by volume, flash 30 °C → ignitable",
      c: { aqueous: true, methanolPct: 24, flashPointC: 30, pH: 7 },
      status: "YES",
    }, // 40 CFR 261.21(a)(1)
    {
      name: "50 % water by weight counts as aqueous → excluded",
      c: { waterPct: 50, methanolPct: 10, flashPointC: 30, pH: 7 },
      status: "NO",
    }, // 85 FR 40594 ≥ 50 % water by weight (from memory, unverified)
    {
      name: "49.9 % water by weight is not aqueous → ignitable",
      c: { waterPct: 49.9, methanolPct: 10, flashPointC: 30, pH: 7 },
      status: "YES",
    }, // 85 FR 40594 (from memory, unverified)
    { name: "no flash point → unknown", c: { ...liquidNonAqueous }, status: "UNKNOWN" },
  ])("$name", ({ c, status }) => {
    expect(assessWasteHazards("METHANOL_RICH", c).ignitable.status).toBe(status);
  });

  it("a flash point below 60 °C with the exclusion unsettled is ignitable and says what is missing", () => {
    const f = assessWasteHazards("WASH_WATER", { flashPointC: 40, pH: 7 }).ignitable;
    expect(f.status).toBe("YES");
    expect(f.missing).toEqual(["aqueous or waterPct"]);
  });

  it("spent filter media (a solid) need the generator's 261.21(a)(2) determination", () => {
    expect(assessWasteHazards("FILTER_MEDIA", {}).ignitable).toMatchObject({
      status: "UNKNOWN",
      missing: ["solidIgnitable"],
    });
    expect(assessWasteHazards("FILTER_MEDIA", { solidIgnitable: true }).ignitable.status).toBe("YES");
  });
});

describe("corrosivity D002", () => {
  it.each([
    { pH: 12.5, status: "YES" }, // 40 CFR 261.22(a)(1): pH ≥ 12.5 (from memory, unverified per 40 CFR 261)
    { pH: 12.49, status: "NO" }, // 40 CFR 261.22(a)(1) (from memory, unverified)
    { pH: 12.36, status: "NO" }, // highest crude-glycerin pH in the OSU 2009 survey (crude glycerin survey as named): close to, not over, the limit
    { pH: 2, status: "YES" }, // 40 CFR 261.22(a)(1): pH ≤ 2 (from memory, unverified)
    { pH: 2.01, status: "NO" }, // 40 CFR 261.22(a)(1) (from memory, unverified)
  ])("aqueous wash water at pH $pH → $status", ({ pH, status }) => {
    expect(
      assessWasteHazards("WASH_WATER", { aqueous: true, pH, methanolPct: 2, flashPointC: 90 }).corrosive.status,
    ).toBe(status);
  });

  it("no pH → unknown", () => {
    expect(assessWasteHazards("GLYCEROL_PHASE", { flashPointC: 90 }).corrosive).toMatchObject({
      status: "UNKNOWN",
      missing: ["pH"],
    });
  });

  it("the pH limits carry their citation and status", () => {
    expect(RULESET_US_FEDERAL_RCRA.corrosivePhAtLeast).toMatchObject({
      value: 12.5,
      source: expect.stringContaining("261.22(a)(1)"),
      status: expect.stringContaining("from memory, unverified"),
    });
    expect(RULESET_US_FEDERAL_RCRA.corrosivePhAtMost.value).toBe(2);
  });
});

describe("overall hazard", () => {
  it.each([
    { name: "no characterisation at all", stream: "GLYCEROL_PHASE", c: null, overall: "NEEDS_CHARACTERISATION" },
    { name: "pH only", stream: "GLYCEROL_PHASE", c: { pH: 9 }, overall: "NEEDS_CHARACTERISATION" },
    {
      name: "stream OTHER without a physical state",
      stream: "OTHER",
      c: { pH: 7, flashPointC: 100 },
      overall: "NEEDS_CHARACTERISATION",
    },
    {
      name: "fully characterised, within limits",
      stream: "GLYCEROL_PHASE",
      c: { pH: 9, flashPointC: 95, aqueous: true, methanolPct: 3 },
      overall: "NON_HAZARDOUS",
    },
    { name: "corrosive", stream: "GLYCEROL_PHASE", c: { pH: 12.6, flashPointC: 95 }, overall: "HAZARDOUS" },
    {
      name: "a listed code (discarded unused methanol U154)",
      stream: "METHANOL_RICH",
      c: { pH: 7, flashPointC: 100, aqueous: false, listedCodes: ["U154"] },
      overall: "HAZARDOUS",
    },
  ] as Array<{ name: string; stream: WasteStream; c: WasteCharacterisation | null; overall: string }>)(
    "$name → $overall",
    ({ stream, c, overall }) => {
      expect(assessWasteHazards(stream, c).overall).toBe(overall);
    },
  );
});

const container = (
  over: Partial<WasteContainerInput> & { id: number; accumulationStartAt: number },
): WasteContainerInput => ({
  code: `W-${over.id}`,
  stream: "GLYCEROL_PHASE",
  massG: 200_000,
  volumeMl: 210_000,
  characterisation: { pH: 12.6, flashPointC: 95 }, // corrosive
  ...over,
});

const site = (over: Partial<WasteSite> = {}): WasteSite => ({
  generatorCategory: "LQG",
  tsdfDistanceMiles: null,
  utcOffsetMin: 0,
  ...over,
});
const NOW = utc("2027-01-01T00:00:00Z");

describe("due dates", () => {
  it.each([
    // Dec 15 + 16 d = Dec 31; +31 = Jan 31 (47); +29 = Feb 29 (76, 2028 is a leap year); +14 = Mar 14 (90)
    {
      name: "LQG 90 days over a leap day",
      s: site(),
      start: "2027-12-15T08:00:00Z",
      due: "2028-03-14T08:00:00Z",
      basis: "LQG_ACCUMULATION",
      days: 90,
    }, // 40 CFR 262.17(a)
    // Sep 1 → Sep 30 (29), Oct 31 (60), Nov 30 (90), Dec 31 (121), Jan 31 (152), Feb 28 (180)
    {
      name: "SQG 180 days across month ends",
      s: site({ generatorCategory: "SQG" }),
      start: "2027-09-01T08:00:00Z",
      due: "2028-02-28T08:00:00Z",
      basis: "SQG_ACCUMULATION",
      days: 180,
    }, // 40 CFR 262.16(b)
    // Dec 1 → Dec 31 (30), Jan 31 (61), Feb 29 (90), Mar 31 (121), Apr 30 (151), May 29 (180)
    {
      name: "SQG 180 days containing 29 Feb",
      s: site({ generatorCategory: "SQG" }),
      start: "2027-12-01T08:00:00Z",
      due: "2028-05-29T08:00:00Z",
      basis: "SQG_ACCUMULATION",
      days: 180,
    }, // 40 CFR 262.16(b)
    // Dec 1 → Dec 31 (30), Jan 31 (61), Feb 28 (89), Mar 31 (120), Apr 30 (150), May 30 (180)
    {
      name: "SQG 180 days without a leap day",
      s: site({ generatorCategory: "SQG" }),
      start: "2026-12-01T08:00:00Z",
      due: "2027-05-30T08:00:00Z",
      basis: "SQG_ACCUMULATION",
      days: 180,
    }, // 40 CFR 262.16(b)
    // Jun 15 → Jun 30 (15), Jul 31 (46), Aug 31 (77), Sep 30 (107), Oct 31 (138), Nov 30 (168), Dec 31 (199), Jan 31 (230), Feb 29 (259), Mar 11 (270)
    {
      name: "SQG 270 days at exactly 200 miles",
      s: site({ generatorCategory: "SQG", tsdfDistanceMiles: 200 }),
      start: "2027-06-15T08:00:00Z",
      due: "2028-03-11T08:00:00Z",
      basis: "SQG_LONG_HAUL_ACCUMULATION",
      days: 270,
    }, // 40 CFR 262.16 (270 d, ≥ 200 miles; former §262.34(e)/(f))
    // Jun 15 → … Nov 30 (168), Dec 12 (180)
    {
      name: "SQG 180 days at 199.9 miles",
      s: site({ generatorCategory: "SQG", tsdfDistanceMiles: 199.9 }),
      start: "2027-06-15T08:00:00Z",
      due: "2027-12-12T08:00:00Z",
      basis: "SQG_ACCUMULATION",
      days: 180,
    }, // 40 CFR 262.16(b)
  ])("$name", ({ s, start, due, basis, days }) => {
    const d = computeWasteDue(container({ id: 1, accumulationStartAt: utc(start) }), s, NOW, false);
    expect(d.dueAt).toBe(utc(due));
    expect(d.dueDate).toBe(due.slice(0, 10));
    expect(d.basis).toBe(basis);
    expect(d.limitDays).toBe(days);
  });

  it("the due date is the site's local calendar date", () => {
    // 2028-03-14T02:00Z is 13 March 21:00 at UTC−05:00
    const d = computeWasteDue(
      container({ id: 1, accumulationStartAt: utc("2027-12-15T02:00:00Z") }),
      site({ utcOffsetMin: -300 }),
      NOW,
      false,
    );
    expect(d.dueDate).toBe("2028-03-13");
  });

  it("VSQG hazardous waste has no federal time limit", () => {
    const d = computeWasteDue(
      container({ id: 1, accumulationStartAt: utc("2027-01-01T00:00:00Z") }),
      site({ generatorCategory: "VSQG" }),
      NOW,
      false,
    );
    expect(d).toMatchObject({ basis: "VSQG_NO_TIME_LIMIT", dueAt: null, dueDate: null });
  });

  it("uncharacterised waste gets the hazardous-waste clock, not the site rule", () => {
    const d = computeWasteDue(
      container({ id: 1, accumulationStartAt: utc("2027-12-15T08:00:00Z"), characterisation: null }),
      site(),
      NOW,
      false,
    );
    expect(d.hazard.overall).toBe("NEEDS_CHARACTERISATION");
    expect(d.dueAt).toBe(utc("2028-03-14T08:00:00Z"));
  });

  it("non-hazardous streams fall due under the site's own rule (no federal limit; 90 days by default)", () => {
    // Jan 1 → Jan 31 (30), Feb 28 (58), Mar 31 (89), Apr 1 (90)
    const d = computeWasteDue(
      container({
        id: 1,
        accumulationStartAt: utc("2026-01-01T10:00:00Z"),
        characterisation: { pH: 9, flashPointC: 95, aqueous: true, methanolPct: 3 },
      }),
      site(),
      NOW,
      false,
    );
    expect(d).toMatchObject({ basis: "NON_HAZARDOUS_SITE_RULE", dueAt: utc("2026-04-01T10:00:00Z"), limitDays: 90 });
    // 40 CFR Part 262 sets no accumulation time for non-hazardous waste: the default is marked as the site's own choice
    expect(d.status).toContain("site's own choice");
    expect(d.source).toContain("no federal time limit");
  });

  it("each default carries its CFR section", () => {
    expect(RULESET_US_FEDERAL_RCRA.lqgMaxDays).toMatchObject({ value: 90, source: "40 CFR 262.17(a)" });
    expect(RULESET_US_FEDERAL_RCRA.sqgMaxDays).toMatchObject({ value: 180, source: "40 CFR 262.16(b)" });
    expect(RULESET_US_FEDERAL_RCRA.sqgMaxOnSiteKg).toMatchObject({ value: 6000, source: "40 CFR 262.16(b)(1)" });
    expect(RULESET_US_FEDERAL_RCRA.vsqgMaxOnSiteKg).toMatchObject({ value: 1000, source: "40 CFR 262.14" });
    expect(RULESET_US_FEDERAL_RCRA.localRulesNote).toBe(
      "Local and state rules may be stricter and govern; confirm with your regulator and licensed hauler.",
    );
  });
});

describe("satellite accumulation", () => {
  it("55 US gal = 208.197 648 12 L", () => {
    // 40 CFR 262.15(a); NIST HB 44 App. C: 1 US gal = 231 in³ = 3.785 411 784 L → 55 × 3.785 411 784 = 208.197 648 12 L
    expect(getSatelliteLimitMl()).toBeCloseTo(208_197.64812, 4);
  });

  const area = (volumeMl: number, excessSince: number | null = null) => [
    container({
      id: 1,
      accumulationStartAt: utc("2027-06-01T00:00:00Z"),
      satelliteAreaId: "SAA-1",
      volumeMl: volumeMl - 100_000,
      satelliteExcessSinceAt: excessSince,
    }),
    container({ id: 2, accumulationStartAt: utc("2027-06-01T00:00:00Z"), satelliteAreaId: "SAA-1", volumeMl: 100_000 }),
  ];

  it("208 197 mL in one area is within the limit: no time limit", () => {
    // 40 CFR 262.15(a): 55 gal = 208 197.648 mL (NIST HB 44 App. C)
    const r = listWasteDue({ containers: area(208_197), site: site(), now: NOW, withinDays: 3650 });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.issues.filter((i) => i.code === "WASTE.SATELLITE_LIMIT_EXCEEDED")).toEqual([]);
    expect(r.value.noTimeLimit.map((d) => d.basis)).toEqual(["SATELLITE_NO_TIME_LIMIT", "SATELLITE_NO_TIME_LIMIT"]);
  });

  it("208 198 mL is over: flagged, and an undated excess is due now", () => {
    // 40 CFR 262.15(a); NIST HB 44 App. C
    const r = listWasteDue({ containers: area(208_198), site: site(), now: NOW, withinDays: 0 });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.issues.map((i) => i.code)).toContain("WASTE.SATELLITE_LIMIT_EXCEEDED");
    expect(r.value.issues.map((i) => i.code)).toContain("WASTE.SATELLITE_EXCESS_NOT_DATED");
    expect(r.value.groups[0]?.items.map((i) => [i.basis, i.dueAt, i.overdue])).toEqual([
      ["SATELLITE_EXCESS_NOT_DATED", NOW, true],
      ["SATELLITE_EXCESS_NOT_DATED", NOW, true],
    ]);
  });

  it("a VSQG's satellite containers have no time limit and no satellite-limit warning", () => {
    // 40 CFR 262.15 applies to SQGs and LQGs (from memory, unverified)
    const r = listWasteDue({
      containers: area(208_198),
      site: site({ generatorCategory: "VSQG" }),
      now: NOW,
      withinDays: 30,
    });
    expect(r.ok && r.value.issues.map((i) => i.code)).toEqual([]);
    expect(r.ok && r.value.noTimeLimit.map((d) => d.basis)).toEqual(["VSQG_NO_TIME_LIMIT", "VSQG_NO_TIME_LIMIT"]);
  });

  it("a dated excess is due 3 consecutive calendar days later, over 29 February", () => {
    // 40 CFR 262.15(a), three consecutive calendar days (EPA RCRA Online 14703): 27 Feb 2028 10:00 → 1 Mar 2028 10:00
    const d = computeWasteDue(area(208_198, utc("2028-02-27T10:00:00Z"))[0] as WasteContainerInput, site(), NOW, true);
    expect(d).toMatchObject({
      basis: "SATELLITE_EXCESS",
      dueAt: utc("2028-03-01T10:00:00Z"),
      dueDate: "2028-03-01",
      limitDays: 3,
    });
  });
});

describe("on-site quantity caps", () => {
  const oneContainer = (massG: number) => [container({ id: 1, accumulationStartAt: NOW, massG })];
  it.each([
    { category: "VSQG", massG: 1_000_000, flagged: false }, // 40 CFR 262.14: 1 000 kg
    { category: "VSQG", massG: 1_000_001, flagged: true }, // 40 CFR 262.14
    { category: "SQG", massG: 6_000_000, flagged: false }, // 40 CFR 262.16(b)(1): 6 000 kg
    { category: "SQG", massG: 6_000_001, flagged: true }, // 40 CFR 262.16(b)(1)
    { category: "LQG", massG: 50_000_000, flagged: false }, // no federal on-site cap for LQGs
  ] as const)("$category with $massG g on site → flagged: $flagged", ({ category, massG, flagged }) => {
    const r = listWasteDue({
      containers: oneContainer(massG),
      site: site({ generatorCategory: category }),
      now: NOW,
      withinDays: 30,
    });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.issues.some((i) => i.code.endsWith("_ON_SITE_CAP_EXCEEDED"))).toBe(flagged);
  });
});

describe("listWasteDue — the hauler list", () => {
  const now = utc("2028-03-01T12:00:00Z");
  const containers: WasteContainerInput[] = [
    // LQG, 90 days: due = start + 90 d
    container({
      id: 1,
      code: "G-1",
      accumulationStartAt: utc("2027-11-22T12:00:00Z"),
      massG: 200_000,
      volumeMl: 210_000,
    }), // due 2028-02-20 12:00, overdue
    container({
      id: 2,
      code: "G-2",
      accumulationStartAt: utc("2027-12-11T12:00:00Z"),
      massG: 150_000,
      volumeMl: 160_000,
    }), // due 2028-03-10 12:00
    container({ id: 3, code: "G-3", accumulationStartAt: utc("2028-01-21T12:00:00Z") }), // due 2028-04-20, beyond 14 days
    container({
      id: 4,
      code: "W-1",
      stream: "WASH_WATER",
      accumulationStartAt: utc("2027-12-06T12:00:00Z"),
      massG: 500_000,
      volumeMl: 500_000,
    }), // due 2028-03-05 12:00
    container({
      id: 5,
      code: "M-1",
      stream: "METHANOL_RICH",
      accumulationStartAt: utc("2027-12-15T12:00:00Z"),
      characterisation: { flashPointC: 11, aqueous: false, pH: 7 },
    }), // due 2028-03-14 12:00
  ];
  const r = listWasteDue({ containers, site: site(), now, withinDays: 14 });

  it("lists what falls due in 14 days, streams with overdue items first", () => {
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.groups.map((g) => [g.stream, g.items.map((i) => i.code)])).toEqual([
      ["GLYCEROL_PHASE", ["G-1", "G-2"]],
      ["WASH_WATER", ["W-1"]],
      ["METHANOL_RICH", ["M-1"]],
    ]);
    const g1 = r.value.groups[0]?.items[0];
    expect(g1).toMatchObject({ overdue: true, dueDate: "2028-02-20" });
    // 20 Feb 12:00 → 1 Mar 12:00 is 10 days (29 Feb included)
    expect(g1?.daysLeft).toBe(-10);
  });

  it("totals per stream in kg, L and US gal", () => {
    if (!r.ok) return;
    const t = r.value.groups[0]?.totals;
    expect(t).toMatchObject({ count: 2, massG: 350_000, volumeMl: 370_000, kg: 350, litres: 370 });
    // 370 L ÷ 3.785 411 784 L per US gal (NIST HB 44 App. C)
    expect(t?.usGallons).toBeCloseTo(370 / 3.785411784, 9);
  });

  it("shows the local-rules note", () => {
    if (!r.ok) return;
    expect(r.value.note).toBe(LOCAL_RULES_NOTE);
  });

  it("a zero-day horizon lists only what is already due", () => {
    const z = listWasteDue({ containers, site: site(), now, withinDays: 0 });
    expect(z.ok && z.value.groups.flatMap((g) => g.items.map((i) => i.code))).toEqual(["G-1"]);
  });

  it("warns about containers that still need characterisation", () => {
    const u = listWasteDue({
      containers: [container({ id: 9, code: "U-1", accumulationStartAt: now, characterisation: { pH: 8 } })],
      site: site(),
      now,
      withinDays: 1,
    });
    expect(u.ok && u.value.issues).toEqual([
      expect.objectContaining({ code: "WASTE.NEEDS_CHARACTERISATION", field: "containers.0.characterisation" }),
    ]);
  });

  it.each([
    { name: "negative horizon", patch: { withinDays: -1 }, code: "WASTE.INVALID_HORIZON" },
    {
      name: "pH above 14",
      patch: { containers: [container({ id: 1, accumulationStartAt: now, characterisation: { pH: 14.1 } })] },
      code: "WASTE.INVALID_PH",
    },
    {
      name: "fractional grams",
      patch: { containers: [container({ id: 1, accumulationStartAt: now, massG: 1.5 })] },
      code: "WASTE.INVALID_MASS",
    },
  ])("refuses $name", ({ patch, code }) => {
    const bad = listWasteDue({ containers, site: site(), now, withinDays: 14, ...patch });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.issues[0]?.code).toBe(code);
  });

  it("keeps day arithmetic in whole days", () => {
    if (!r.ok) return;
    const g2 = r.value.groups[0]?.items[1];
    expect(((g2?.dueAt ?? 0) - utc("2027-12-11T12:00:00Z")) / DAY).toBe(90);
  });
});
