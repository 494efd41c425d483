import { describe, expect, it } from "vitest";
import { RULESET_EU_2022_996 } from "@/lib/custody/custody-balance";
import { bookMaterial, collectInputs, movesToCompose, setOf } from "@/lib/custody/custody-inputs";
import { assembleCustodyReport } from "@/lib/custody/custody-report";
import type { CustodyLedgerRows } from "@/lib/custody/custody-rows";
import type { CompositionParts } from "@/lib/trace/composition";
import type { EntryHolderFacts, SourceFacts } from "@/lib/trace/trace-facts";

// A fictional plant: one certified source, one source without a certificate, one pickup lot and one batch.
const at = (iso: string) => new Date(iso);
const KG = 1000;

const SOURCE: SourceFacts = {
  code: "SRC-1",
  name: "Harbour Fryhouse",
  kind: "RESTAURANT",
  certificateScheme: "SCHEME-A",
  certificateNo: "CERT-0001",
  certificateExpires: at("2027-01-01T00:00:00Z"),
  creditWithheld: false,
};
const LOT = {
  holderId: 10,
  code: "L-1",
  material: "USED_COOKING_OIL",
  origin: "PICKUPS",
  certified: true,
  receivedAt: at("2026-02-02T00:00:00Z"),
};

function pickup(holderId: number, source: SourceFacts | null, lot = LOT): EntryHolderFacts {
  return {
    holderId,
    kind: "PICKUP",
    code: `P-${holderId}`,
    pickup: { code: `P-${holderId}`, observedAt: at("2026-02-01T00:00:00Z") },
    lot,
    source,
    material: "USED_COOKING_OIL",
    reagent: null,
  };
}

const FACTS = new Map<number, EntryHolderFacts>([
  [1, pickup(1, SOURCE)],
  [2, pickup(2, { ...SOURCE, code: "SRC-2", certificateNo: null, certificateScheme: null })],
  [3, pickup(3, SOURCE, { ...LOT, certified: false })],
  [4, pickup(4, { ...SOURCE, code: "SRC-4", creditWithheld: true })],
]);

const ROWS: CustodyLedgerRows = {
  entries: [
    { id: 101, at: at("2026-02-01T08:00:00Z"), toHolderId: 1, massG: 600 * KG },
    { id: 102, at: at("2026-02-01T09:00:00Z"), toHolderId: 2, massG: 300 * KG },
    { id: 103, at: at("2026-02-01T10:00:00Z"), toHolderId: 3, massG: 50 * KG },
    { id: 104, at: at("2026-02-01T11:00:00Z"), toHolderId: 4, massG: 20 * KG },
  ],
  batchMoves: [
    { id: 201, at: at("2026-02-10T00:00:00Z"), role: "OIL", fromHolderId: 50, toHolderId: 60, massG: 800 * KG },
    { id: 202, at: at("2026-02-11T00:00:00Z"), role: "ESTER", fromHolderId: 60, toHolderId: 70, massG: 780 * KG },
  ],
  lotLosses: [],
  batches: [{ holderId: 60, code: "B-1", completedAt: at("2026-02-11T00:00:00Z") }],
  shipments: [
    {
      holderId: 80,
      documentNo: "S-1",
      customer: "Blue Road Haulage",
      shippedAt: at("2026-02-20T00:00:00Z"),
      massG: 400 * KG,
      certifiedClaim: true,
    },
    {
      holderId: 81,
      documentNo: "S-2",
      customer: "Blue Road Haulage",
      shippedAt: at("2026-02-21T00:00:00Z"),
      massG: 900 * KG,
      certifiedClaim: true,
    },
  ],
};

// The genealogy's answer for the oil charge: 500 kg of the certified pickup, 300 kg of the uncertified one.
const CARRIED = new Map<number, CompositionParts>([[201, { originIds: [101, 102], grams: [500 * KG, 300 * KG] }]]);

const KEY = "SCHEME-A | USED_COOKING_OIL";

describe("custody inputs", () => {
  it("credits a certified lot from a source certified on the day, and nothing after the certificate expired", () => {
    expect(setOf(FACTS.get(1), Date.parse("2026-02-01T00:00:00Z"))?.key).toBe(KEY);
    expect(setOf(FACTS.get(1), Date.parse("2027-02-01T00:00:00Z"))).toBeNull();
    expect(setOf(FACTS.get(3), Date.parse("2026-02-01T00:00:00Z"))).toBeNull();
  });

  it("sorts entries into credited inputs and the reasons others are not credited", () => {
    const inputs = collectInputs(ROWS.entries, FACTS);
    expect([...inputs.setOfOrigin]).toEqual([[101, KEY]]);
    expect(inputs.inputs).toEqual([
      { at: LOT.receivedAt.getTime(), lotCode: "L-1", setKey: KEY, material: "USED_COOKING_OIL", grams: 600 * KG },
    ]);
    expect(inputs.notCredited).toEqual({
      lotOnlyG: 300 * KG,
      sourceOnlyG: 50 * KG,
      surplusG: 0,
      withheldG: 20 * KG,
      withheldSources: ["SRC-4"],
    });
  });

  it("converts only the certified share of a batch's oil at the batch's measured yield", () => {
    const inputs = collectInputs(ROWS.entries, FACTS);
    const { oilMoves, moveIds } = movesToCompose(ROWS);
    expect(moveIds).toEqual([201]);
    const booked = bookMaterial(ROWS, inputs, oilMoves, CARRIED);
    expect(booked.bookings.map((b) => b.id)).toEqual(["IN:L-1:" + KEY, "CONV:B-1:" + KEY]);
    expect(booked.conversions).toEqual([
      {
        batchCode: "B-1",
        completedAt: at("2026-02-11T00:00:00Z"),
        oilG: 800 * KG,
        esterG: 780 * KG,
        factor: 780 / 800,
        // 500 kg × 780/800 = 487.5 kg of ester credit.
        bySet: [
          { setKey: KEY, material: "USED_COOKING_OIL", certifiedOilG: 500 * KG, fameCreditG: 487_500, accepted: true },
        ],
      },
    ]);
  });
});

describe("custody report", () => {
  const report = (query: { period?: string; claimKg?: number; claimSet?: string } = {}) => {
    const inputs = collectInputs(ROWS.entries, FACTS);
    const { oilMoves } = movesToCompose(ROWS);
    return assembleCustodyReport({
      query: { operatorType: "OTHER_OPERATOR", ...query },
      siteId: 1,
      ruleSet: RULESET_EU_2022_996,
      utcOffsetMin: 0,
      shipments: ROWS.shipments,
      inputs,
      booked: bookMaterial(ROWS, inputs, oilMoves, CARRIED),
      nowMs: Date.parse("2026-03-01T00:00:00Z"),
    });
  };

  it("accepts a claim within the credit and refuses the next one with its shortfall", () => {
    const r = report();
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.claims.map((c) => [c.documentNo, c.accepted, c.availableG, c.shortfallG])).toEqual([
      ["S-1", true, 487_500, 0],
      ["S-2", false, 87_500, 900 * KG - 87_500],
    ]);
    expect(r.value.failures.map((f) => f.description)).toEqual(["Shipment S-2 to Blue Road Haulage claimed certified"]);
    expect(r.value.selected.label).toBe(r.value.periods[0]?.label);
    expect(r.value.bookings).toBe(4);
  });

  it("tries a claim now against the set with the most credit, without saving it", () => {
    const r = report({ claimKg: 50 });
    expect(r.ok && r.value.claimCheck).toEqual({
      ok: true,
      setKey: KEY,
      massG: 50 * KG,
      check: { availableG: 87_500, balanceAfterG: 37_500 },
    });
    const unknown = report({ claimKg: 1, claimSet: "NO SUCH SET" });
    expect(unknown.ok && unknown.value.claimCheck).toMatchObject({ ok: false, issues: [{ field: "claimSet" }] });
  });

  it("names the field when the period asked for is not a balance period", () => {
    const r = report({ period: "1999-Q1" });
    expect(r.ok ? null : r.issues[0]?.field).toBe("period");
  });
});
