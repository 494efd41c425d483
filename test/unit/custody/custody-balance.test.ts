import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  RULESET_EU_2022_996,
  buildCustodyLedger,
  checkClaim,
  convertCredit,
  withCustodySettings,
} from "@/lib/custody/custody-balance";
import type { ClaimBooking, CustodyBooking, CustodyLedger, CustodyState } from "@/lib/custody/custody-balance";

const utc = (iso: string): number => Date.parse(iso);
const KG = 1000;

const SET = "SCHEME-A|CERT-0001|UCO|NL";
const OTHER_SET = "SCHEME-A|CERT-0002|UCO|BE";

// Measured yield 980 kg ester per 1 000 kg oil → factor 0.98 (an operator's measured value; common practice, no source).
const TRANSESTERIFICATION = {
  id: "TRANSESTERIFICATION",
  inputMaterial: "OIL",
  outputs: [
    { material: "ESTER", outputMassG: 980 * KG, inputMassG: 1000 * KG },
    { material: "GLYCEROL_PHASE", outputMassG: 105 * KG, inputMassG: 1000 * KG },
  ],
  basis: "batches of 2025-Q4",
};

function stateWith(bookings: CustodyBooking[], extra: Partial<CustodyState> = {}): CustodyState {
  return {
    siteId: 1,
    ruleSet: RULESET_EU_2022_996,
    operatorType: "OTHER_OPERATOR",
    utcOffsetMin: 0,
    sets: [
      { key: SET, attributes: { scheme: "SCHEME-A", certificate: "CERT-0001", material: "UCO", country: "NL" } },
      { key: OTHER_SET, attributes: { scheme: "SCHEME-A", certificate: "CERT-0002", material: "UCO", country: "BE" } },
    ],
    steps: [TRANSESTERIFICATION],
    bookings,
    ...extra,
  };
}

const input = (id: string, at: string, material: string, kg: number, setKey = SET): CustodyBooking => ({
  kind: "INPUT",
  id,
  at: utc(at),
  setKey,
  material,
  massG: kg * KG,
});
const convert = (id: string, at: string, kg: number, setKey = SET): CustodyBooking => ({
  kind: "CONVERSION",
  id,
  at: utc(at),
  setKey,
  stepId: "TRANSESTERIFICATION",
  inputMassG: kg * KG,
});
const claim = (id: string, at: string, kg: number, material = "ESTER", setKey = SET): ClaimBooking => ({
  kind: "CLAIM",
  id,
  at: utc(at),
  setKey,
  material,
  massG: kg * KG,
});

function requireLedger(state: CustodyState): CustodyLedger {
  const r = buildCustodyLedger(state);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.value;
}

function account(ledger: CustodyLedger, material: string, setKey = SET) {
  const a = ledger.accounts.find((x) => x.material === material && x.setKey === setKey);
  if (a === undefined) throw new Error(`no account ${setKey}/${material}`);
  return a;
}

describe("RULESET_EU_2022_996", () => {
  it("balance period 3 months for operators, 12 for agricultural and forest biomass producers", () => {
    // Reg. (EU) 2022/996 Art. 19(2)(l), text as published 27.6.2022
    expect(RULESET_EU_2022_996.balancePeriodMonths.OTHER_OPERATOR.value).toBe(3);
    expect(RULESET_EU_2022_996.balancePeriodMonths.AGRI_FOREST_PRODUCER_OR_FIRST_GATHERING_POINT.value).toBe(12);
    expect(RULESET_EU_2022_996.balancePeriodMonths.OTHER_OPERATOR.source).toContain("Art. 19(2)(l)");
  });

  it("marks the never-negative rule as our policy and the recalled items as from memory", () => {
    expect(RULESET_EU_2022_996.negativeBalance.value).toBe("NEVER_NEGATIVE_AT_ANY_BOOKING");
    expect(RULESET_EU_2022_996.negativeBalance.status).toContain(
      "our conservative policy (common practice, no source)",
    );
    expect(RULESET_EU_2022_996.carryForward.value).toBe("CARRY_POSITIVE");
    expect(RULESET_EU_2022_996.notes.some((n) => n.includes("from memory, unverified"))).toBe(true);
  });

  it("a site setting replaces a value and says what it replaced", () => {
    const r = withCustodySettings(RULESET_EU_2022_996, { carryForward: "LAPSE" });
    expect(r.carryForward.value).toBe("LAPSE");
    expect(r.carryForward.source).toBe("site setting");
    expect(r.carryForward.status).toContain("CARRY_POSITIVE");
    expect(r.negativeBalance).toBe(RULESET_EU_2022_996.negativeBalance);
  });
});

describe("conversion factors from measured yields", () => {
  it.each([
    { name: "1 000 kg oil × 0.98", inputG: 1_000_000, expected: 980_000 },
    { name: "999 g × 0.98 = 979.02 g, rounded down", inputG: 999, expected: 979 },
    { name: "1 g × 0.98 = 0.98 g, rounded down", inputG: 1, expected: 0 },
    { name: "2 000 t × 0.98 stays exact", inputG: 2_000_000_000, expected: 1_960_000_000 },
  ])("$name", ({ inputG, expected }) => {
    expect(convertCredit(inputG, { material: "ESTER", outputMassG: 980_000, inputMassG: 1_000_000 })).toBe(expected);
  });
});

describe("buildCustodyLedger — the claim that a later input would have covered", () => {
  const bookings = [
    input("IN-1", "2026-01-05T08:00:00Z", "OIL", 1000),
    convert("CV-1", "2026-01-10T08:00:00Z", 1000),
    claim("CL-1", "2026-01-15T08:00:00Z", 500),
    claim("CL-2", "2026-01-20T08:00:00Z", 480),
    claim("CL-3", "2026-01-25T08:00:00Z", 1),
    input("IN-2", "2026-02-01T08:00:00Z", "OIL", 1000),
    convert("CV-2", "2026-02-02T08:00:00Z", 1000),
  ];
  const ledger = requireLedger(stateWith(bookings));

  it("1 000 kg certified oil at factor 0.98 gives 980 kg ester credit; 500 + 480 kg claims pass", () => {
    const ester = account(ledger, "ESTER");
    expect(ester.entries.map((e) => [e.bookingId, e.deltaG, e.balanceG, e.accepted])).toEqual([
      ["CV-1", 980_000, 980_000, true],
      ["CL-1", -500_000, 480_000, true],
      ["CL-2", -480_000, 0, true],
      ["CL-3", 0, 0, false],
      ["CV-2", 980_000, 980_000, true],
    ]);
    expect(account(ledger, "OIL").balanceG).toBe(0);
    // 1 000 kg × 105/1 000
    expect(account(ledger, "GLYCEROL_PHASE").balanceG).toBe(2 * 105_000);
  });

  it("the 1 kg claim fails at its booking, naming it and the shortfall", () => {
    expect(ledger.failures).toEqual([
      expect.objectContaining({
        code: "CUSTODY.CLAIM_EXCEEDS_BALANCE",
        bookingId: "CL-3",
        requestedG: 1_000,
        availableG: 0,
        shortfallG: 1_000,
        field: "bookings.4.massG",
      }),
    ]);
  });

  it("checkClaim refuses the same claim before it is saved", () => {
    const saved = bookings.filter((b) => b.id !== "CL-3");
    const r = checkClaim(stateWith(saved), claim("CL-3", "2026-01-25T08:00:00Z", 1));
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.issues[0]).toMatchObject({ code: "CUSTODY.CLAIM_EXCEEDS_BALANCE", field: "massG", shortfallG: 1_000 });
  });

  it("checkClaim accepts it once booked after the covering input", () => {
    const saved = bookings.filter((b) => b.id !== "CL-3");
    expect(checkClaim(stateWith(saved), claim("CL-4", "2026-02-03T08:00:00Z", 1))).toEqual({
      ok: true,
      value: { availableG: 980_000, balanceAfterG: 979_000 },
    });
  });

  it("checkClaim refuses a back-dated claim that would starve a claim already accepted", () => {
    const saved = bookings.filter((b) => b.id !== "CL-3");
    const r = checkClaim(stateWith(saved), claim("CL-0", "2026-01-12T08:00:00Z", 10));
    expect(r.ok).toBe(false);
    // CL-2 then asks 480 kg of 980 − 10 − 500 = 470 kg: 10 kg short
    if (!r.ok)
      expect(r.issues).toEqual([
        expect.objectContaining({ code: "CUSTODY.CLAIM_BREAKS_LATER_BOOKING", field: "massG" }),
      ]);
    if (!r.ok) expect(r.issues[0]?.message).toContain("CL-2");
  });

  it("balances of different characteristic sets never mix", () => {
    const r = checkClaim(stateWith(bookings), claim("CL-X", "2026-03-01T08:00:00Z", 1, "ESTER", OTHER_SET));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ code: "CUSTODY.CLAIM_EXCEEDS_BALANCE", availableG: 0 });
  });

  it("a conversion cannot process more certified oil than the balance holds", () => {
    const l = requireLedger(
      stateWith([input("IN-1", "2026-01-05T08:00:00Z", "OIL", 1000), convert("CV-1", "2026-01-10T08:00:00Z", 1100)]),
    );
    expect(l.failures).toEqual([
      expect.objectContaining({ code: "CUSTODY.CONVERSION_EXCEEDS_BALANCE", bookingId: "CV-1", shortfallG: 100_000 }),
    ]);
    expect(l.accounts.some((a) => a.material === "ESTER" && a.balanceG > 0)).toBe(false);
  });
});

describe("balance periods and carry-forward", () => {
  // Calendar quarters, Reg. (EU) 2022/996 Art. 19(2)(l): Q1 = [1 Jan, 1 Apr).
  const q1 = [
    input("IN-1", "2026-01-05T08:00:00Z", "OIL", 1000),
    convert("CV-1", "2026-01-10T08:00:00Z", 1000),
    claim("CL-1", "2026-03-31T23:59:59Z", 900),
  ];

  it("a positive closing balance carries into the next quarter", () => {
    const l = requireLedger(stateWith([...q1, claim("CL-2", "2026-04-01T00:00:00Z", 80)]));
    expect(l.failures).toEqual([]);
    const ester = account(l, "ESTER");
    expect(
      ester.periods.map((p) => [p.label, p.openingG, p.creditsG, p.debitsG, p.closingG, p.carriedForwardG, p.closed]),
    ).toEqual([
      ["2026-Q1", 0, 980_000, 900_000, 80_000, 80_000, true],
      ["2026-Q2", 80_000, 0, 80_000, 0, null, false],
    ]);
    expect(ester.entries.find((e) => e.kind === "CARRY_FORWARD")).toMatchObject({
      at: utc("2026-04-01T00:00:00Z"),
      balanceG: 80_000,
      period: "2026-Q1",
    });
  });

  it("with carry-forward set to lapse, the same claim fails in the next quarter", () => {
    const lapse = withCustodySettings(RULESET_EU_2022_996, { carryForward: "LAPSE" });
    const l = requireLedger(stateWith([...q1, claim("CL-2", "2026-04-01T00:00:00Z", 80)], { ruleSet: lapse }));
    expect(l.failures).toEqual([
      expect.objectContaining({ code: "CUSTODY.CLAIM_EXCEEDS_BALANCE", bookingId: "CL-2", shortfallG: 80_000 }),
    ]);
    expect(account(l, "ESTER").entries.find((e) => e.kind === "LAPSE")).toMatchObject({ deltaG: -80_000, balanceG: 0 });
  });

  it("an agricultural producer's 12-month period keeps Q1 and Q2 in one period", () => {
    const l = requireLedger(
      stateWith([...q1, claim("CL-2", "2026-04-01T00:00:00Z", 80)], {
        operatorType: "AGRI_FOREST_PRODUCER_OR_FIRST_GATHERING_POINT",
      }),
    );
    expect(account(l, "ESTER").periods.map((p) => p.label)).toEqual(["2026"]);
  });

  it("period bounds follow the site's local midnight", () => {
    // 2026-03-31T23:30Z is 1 April 00:30 at UTC+01:00, so it opens Q2.
    const l = requireLedger(stateWith([input("IN-1", "2026-03-31T23:30:00Z", "ESTER", 5)], { utcOffsetMin: 60 }));
    expect(account(l, "ESTER").periods[0]?.label).toBe("2026-Q2");
  });

  it("closeThroughMs closes the quarters that have ended, empty ones included", () => {
    const l = requireLedger(stateWith(q1, { closeThroughMs: utc("2026-10-01T00:00:00Z") }));
    expect(account(l, "ESTER").periods.map((p) => [p.label, p.openingG, p.closed])).toEqual([
      ["2026-Q1", 0, true],
      ["2026-Q2", 80_000, true],
      ["2026-Q3", 80_000, true],
      ["2026-Q4", 80_000, false],
    ]);
  });

  it("under the period-end policy a dip inside the quarter passes, a negative close fails", () => {
    const endOnly = withCustodySettings(RULESET_EU_2022_996, { negativeBalance: "NON_NEGATIVE_AT_PERIOD_END" });
    const covered = requireLedger(
      stateWith(
        [
          input("IN-1", "2026-01-05T00:00:00Z", "ESTER", 100),
          claim("CL-1", "2026-01-06T00:00:00Z", 150),
          input("IN-2", "2026-02-01T00:00:00Z", "ESTER", 60),
        ],
        {
          ruleSet: endOnly,
          closeThroughMs: utc("2026-04-01T00:00:00Z"),
        },
      ),
    );
    expect(covered.failures).toEqual([]);
    const uncovered = requireLedger(
      stateWith([input("IN-1", "2026-01-05T00:00:00Z", "ESTER", 100), claim("CL-1", "2026-01-06T00:00:00Z", 150)], {
        ruleSet: endOnly,
        closeThroughMs: utc("2026-04-01T00:00:00Z"),
      }),
    );
    expect(uncovered.failures).toEqual([
      expect.objectContaining({ code: "CUSTODY.PERIOD_CLOSES_NEGATIVE", bookingId: "CL-1", shortfallG: 50_000 }),
    ]);
  });
});

describe("input validation", () => {
  it.each([
    {
      name: "an undeclared set",
      b: input("IN-1", "2026-01-05T08:00:00Z", "OIL", 1, "NOPE"),
      code: "CUSTODY.UNKNOWN_SET",
      field: "bookings.0.setKey",
    },
    {
      name: "an undefined step",
      b: { ...convert("CV-1", "2026-01-05T08:00:00Z", 1), stepId: "DISTILLATION" },
      code: "CUSTODY.UNKNOWN_STEP",
      field: "bookings.0.stepId",
    },
    {
      name: "a zero mass",
      b: input("IN-1", "2026-01-05T08:00:00Z", "OIL", 0),
      code: "CUSTODY.INVALID_MASS",
      field: "bookings.0.massG",
    },
  ])("refuses $name", ({ b, code, field }) => {
    const r = buildCustodyLedger(stateWith([b]));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ code, field });
  });

  it("refuses a claim whose number is already used", () => {
    const r = checkClaim(
      stateWith([input("IN-1", "2026-01-05T08:00:00Z", "ESTER", 10)]),
      claim("IN-1", "2026-01-06T08:00:00Z", 1),
    );
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ code: "CUSTODY.DUPLICATE_BOOKING", field: "id" });
  });
});

describe("property: claims accepted by checkClaim never take a balance below zero", () => {
  const step = fc.record({
    kind: fc.constantFrom("INPUT_OIL", "INPUT_ESTER", "CONVERSION", "CLAIM", "CLAIM"),
    set: fc.constantFrom(SET, OTHER_SET),
    dayOffset: fc.integer({ min: 0, max: 400 }),
    kg: fc.integer({ min: 1, max: 1500 }),
  });

  it("holds for random inputs, conversions and claims in any booking order", () => {
    fc.assert(
      fc.property(fc.array(step, { maxLength: 25 }), (steps) => {
        const start = utc("2026-01-01T00:00:00Z");
        let state = stateWith([]);
        let accepted = 0;
        steps.forEach((s, i) => {
          const at = start + s.dayOffset * 86_400_000 + i;
          const id = `B-${i}`;
          if (s.kind === "CLAIM") {
            const c: ClaimBooking = { kind: "CLAIM", id, at, setKey: s.set, material: "ESTER", massG: s.kg * KG };
            if (checkClaim(state, c).ok) {
              state = { ...state, bookings: [...state.bookings, c] };
              accepted += 1;
            }
            return;
          }
          const b: CustodyBooking =
            s.kind === "CONVERSION"
              ? { kind: "CONVERSION", id, at, setKey: s.set, stepId: "TRANSESTERIFICATION", inputMassG: s.kg * KG }
              : {
                  kind: "INPUT",
                  id,
                  at,
                  setKey: s.set,
                  material: s.kind === "INPUT_OIL" ? "OIL" : "ESTER",
                  massG: s.kg * KG,
                };
          state = { ...state, bookings: [...state.bookings, b] };
        });
        const ledger = requireLedger(state);
        expect(ledger.failures.filter((f) => f.code === "CUSTODY.CLAIM_EXCEEDS_BALANCE")).toEqual([]);
        for (const a of ledger.accounts) {
          for (const e of a.entries) expect(e.balanceG).toBeGreaterThanOrEqual(0);
          // the running balance is the sum of the accepted movements
          expect(a.entries.reduce((sum, e) => sum + (e.accepted ? e.deltaG : 0), 0)).toBe(a.balanceG);
        }
        const claimed = ledger.accounts
          .flatMap((a) => a.entries)
          .filter((e) => e.kind === "CLAIM" && e.accepted).length;
        expect(claimed).toBe(accepted);
      }),
      { numRuns: 250 },
    );
  });
});
