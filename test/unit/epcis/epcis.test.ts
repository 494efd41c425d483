import { describe, expect, it } from "vitest";
import { buildEpcisDocument, formatOffset, kgOf, UOM_KG } from "@/lib/epcis/epcis";
import type { EpcisDocument, EpcisEvent, EpcisHolder, EpcisMove } from "@/lib/epcis/epcis";
import { EpcisDocumentSchema } from "@/lib/epcis/epcis-document.schema";
import { escapeEpcComponent, gs1CheckDigit, gtinFor, identifierScheme } from "@/lib/epcis/identifiers";
import { backwardScope, forwardScope } from "@/lib/epcis/scope";
import { computePeriodBalance } from "@/lib/mass-balance/period-balance";
import type { BalanceHolder } from "@/lib/mass-balance/period-balance";
import type { MoveRole } from "@/lib/core/vocabulary";

// A small fictional plant: two pickups pooled into a lot, a tank, one finished batch, one still running,
// a shipment, and receipts outside November 2026.
const H: EpcisHolder[] = [
  { id: 1, kind: "PICKUP", code: "P-1", material: "USED_COOKING_OIL", sourceCode: "SRC-A" },
  { id: 2, kind: "PICKUP", code: "P-2", material: "USED_COOKING_OIL", sourceCode: "SRC-B" },
  { id: 3, kind: "LOT", code: "L-0001", material: "USED_COOKING_OIL" },
  { id: 4, kind: "TANK", code: "T-1", material: "MIXED_FEEDSTOCK" },
  { id: 5, kind: "REAGENT_LOT", code: "M-1", material: "METHANOL" },
  { id: 6, kind: "REAGENT_LOT", code: "K-1", material: "KOH" },
  { id: 7, kind: "BATCH", code: "B-1", material: null },
  { id: 8, kind: "PRODUCT_LOT", code: "PL-1", material: "FAME" },
  { id: 9, kind: "TANK", code: "T-GLY", material: "GLYCEROL_PHASE" },
  { id: 10, kind: "SHIPMENT", code: "BOL-1", material: "FAME", customerCode: "CUS-1" },
  { id: 11, kind: "LOSS", code: "LOSS-1", material: null },
  { id: 12, kind: "BATCH", code: "B-2", material: null },
  { id: 13, kind: "LOT", code: "L-0002", material: "USED_COOKING_OIL", sourceCode: "SUP-1" },
];
const t = (day: number, hour = 8) => Date.UTC(2026, 10, day, hour);
let seq = 0;
const mv = (at: number, role: MoveRole, from: number | null, to: number, massG: number): EpcisMove => ({
  id: ++seq,
  at,
  role,
  fromHolderId: from,
  toHolderId: to,
  massG,
});
const M: EpcisMove[] = [
  mv(t(1), "RECEIPT", null, 5, 40_000),
  mv(t(1), "RECEIPT", null, 6, 2_000),
  mv(t(2), "RECEIPT", null, 1, 100_000),
  mv(t(2), "RECEIPT", null, 2, 50_125),
  mv(t(3), "TRANSFER", 1, 3, 100_000),
  mv(t(3), "TRANSFER", 2, 3, 50_125),
  mv(t(4), "TRANSFER", 3, 4, 150_125),
  mv(t(10), "OIL", 4, 7, 100_000),
  mv(t(10), "METHANOL", 5, 7, 20_000),
  mv(t(10), "CATALYST", 6, 7, 1_000),
  mv(t(10, 9), "OIL", 4, 7, 10_001),
  mv(t(11), "ESTER", 7, 8, 98_000),
  mv(t(11), "GLYCEROL_PHASE", 7, 9, 30_000),
  mv(t(11), "LOSS", 7, 11, 3_001),
  mv(t(20), "SHIPMENT", 8, 10, 98_000),
  mv(t(30, 12), "OIL", 4, 12, 20_000),
  mv(Date.UTC(2026, 11, 1, 0, 30), "RECEIPT", null, 13, 30_000),
  mv(Date.UTC(2026, 9, 31, 23), "RECEIPT", null, 13, 1_000),
];
const NOVEMBER = { startMs: Date.UTC(2026, 10, 1), endMs: Date.UTC(2026, 11, 1) };
// GS1's own example company prefix (EPC Tag Data Standard examples use 0614141).
const GS1 = identifierScheme({ gs1CompanyPrefix: "0614141", baseUri: "https://plant.example", siteCode: "NORTH" });
const OWN = identifierScheme({ gs1CompanyPrefix: null, baseUri: "https://plant.example/", siteCode: "NORTH" });

function build(ids = GS1, extra: Partial<Parameters<typeof buildEpcisDocument>[0]> = {}): EpcisDocument {
  return buildEpcisDocument({
    holders: H,
    moves: M,
    ids,
    eventBase: "https://plant.example/id/NORTH/event",
    period: NOVEMBER,
    offsetMin: () => 60,
    createdAt: new Date(Date.UTC(2026, 11, 5)),
    ...extra,
  });
}

const gramsOf = (list: EpcisEvent["inputQuantityList"]) =>
  (list ?? []).reduce((s, q) => s + Math.round(q.quantity * 1000), 0);

describe("EPCIS 2.0 export of a period", () => {
  // Checked against our zod statement of the GS1 EPCIS 2.0.0 JSON Schema (lib/epcis/epcis-document.schema.ts).
  it.each([
    ["GS1 identifiers", GS1],
    ["the site's own identifiers", OWN],
  ])("is a valid EPCIS 2.0 document with %s", (_, ids) => {
    const doc = build(ids);
    const parsed = EpcisDocumentSchema.safeParse(doc);
    expect(parsed.success ? [] : parsed.error.issues).toEqual([]);
    expect(doc.schemaVersion).toBe("2.0");
    expect(doc["@context"]).toEqual(["https://ref.gs1.org/standards/epcis/2.0.0/epcis-context.jsonld"]);
  });

  it("puts every event time inside the period and leaves out the running batch", () => {
    const events = build().epcisBody.eventList;
    for (const e of events) {
      const at = Date.parse(e.eventTime);
      expect(at).toBeGreaterThanOrEqual(NOVEMBER.startMs);
      expect(at).toBeLessThan(NOVEMBER.endMs);
    }
    expect(events.filter((e) => e.type === "ObjectEvent")).toHaveLength(8);
    expect(events.filter((e) => e.type === "TransformationEvent").map((e) => e.transformationID)).toEqual([
      "https://plant.example/id/NORTH/batch/B-1",
    ]);
  });

  it("round trip: each batch's inputs add up to the mass the period balance says it was charged", () => {
    const doc = build();
    const holders: BalanceHolder[] = H.map((h) => ({
      id: h.id,
      kind: h.kind,
      siteId: 1,
      materialKind: h.material,
      ...(h.kind === "BATCH" ? { completedAt: h.code === "B-1" ? t(11) : null } : {}),
    }));
    const balance = computePeriodBalance({ holders, moves: M, period: NOVEMBER, scope: { siteId: 1 } });
    if (!balance.ok) throw new Error(JSON.stringify(balance.issues));
    const charged = new Map(balance.value.process.completed.map((b) => [b.holderId, b.inputsG]));
    const transformations = doc.epcisBody.eventList.filter((e) => e.type === "TransformationEvent");
    expect(transformations).toHaveLength(charged.size);
    const b1 = transformations[0];
    expect(gramsOf(b1?.inputQuantityList)).toBe(charged.get(7));
    expect(gramsOf(b1?.inputQuantityList)).toBe(131_001);
    // The tank drawn twice is one input line of 110.001 kg; the loss is not an output object.
    expect(b1?.inputQuantityList).toContainEqual({
      epcClass: "urn:epc:class:lgtin:0614141.000008.T-1",
      quantity: 110.001,
      uom: UOM_KG,
    });
    expect(gramsOf(b1?.outputQuantityList)).toBe(128_000);
    expect(b1?.outputQuantityList?.map((q) => q.epcClass)).toEqual([
      "urn:epc:class:lgtin:0614141.000020.PL-1",
      "urn:epc:class:lgtin:0614141.000021.B-1",
    ]);
  });

  it("names the source of a pickup and the customer of a shipment", () => {
    const events = build().epcisBody.eventList;
    const pickup = events.find((e) => e.eventID.endsWith("/move/3"));
    expect(pickup?.bizStep).toBe("collecting");
    expect(pickup?.sourceList).toEqual([
      { type: "owning_party", source: "https://plant.example/id/NORTH/source/SRC-A" },
    ]);
    const ship = events.find((e) => e.bizStep === "shipping");
    expect(ship?.destinationList).toEqual([
      { type: "owning_party", destination: "https://plant.example/id/NORTH/customer/CUS-1" },
    ]);
    expect(ship?.bizTransactionList).toEqual([
      { type: "bol", bizTransaction: "https://plant.example/id/NORTH/shipment/BOL-1" },
    ]);
    const intoTank = events.find((e) => e.eventID.endsWith("/move/7"));
    expect(intoTank?.sourceList).toEqual([{ type: "location", source: "urn:epc:id:sgln:0614141.00000.0" }]);
    expect(intoTank?.destinationList).toEqual([{ type: "location", destination: "urn:epc:id:sgln:0614141.00000.T-1" }]);
    const hidden = buildEpcisDocument({
      holders: H.map((h) => ({ ...h, customerCode: null })),
      moves: M,
      ids: GS1,
      eventBase: "https://plant.example/e",
      period: NOVEMBER,
      offsetMin: () => 0,
      createdAt: new Date(),
    });
    expect(hidden.epcisBody.eventList.find((e) => e.bizStep === "shipping")?.destinationList).toBeUndefined();
  });
});

describe("GS1 identifiers", () => {
  it("computes the GS1 check digit", () => {
    // GS1 General Specifications §7.9.1; GTIN 09506000134352 is the GS1 Digital Link standard's example.
    expect(gs1CheckDigit("0950600013435")).toBe(2);
    // GS1 EPC Tag Data Standard, SGTIN example: GTIN 80614141123458.
    expect(gs1CheckDigit("8061414112345")).toBe(8);
    expect(gtinFor("0614141", "USED_COOKING_OIL")).toBe(`0061414100001${gs1CheckDigit("0061414100001")}`);
  });

  it("escapes the characters the EPC URI forms reserve", () => {
    // GS1 EPC Tag Data Standard, escaping of '"', '%', '&', '/', '<', '>', '?' in URI components (from memory for the clause number).
    expect(escapeEpcComponent("L/7?&")).toBe("L%2F7%3F%26");
    expect(GS1.lotClass("TALLOW", "A/B")).toBe("urn:epc:class:lgtin:0614141.000004.A%2FB");
  });

  it("falls back to the site's own URI for a lot GS1 cannot carry", () => {
    expect(GS1.lotClass("TALLOW", "X".repeat(21))).toBe(
      `https://plant.example/id/NORTH/class/TALLOW/${"X".repeat(21)}`,
    );
    expect(OWN.location("T-1")).toBe("https://plant.example/id/NORTH/location/T-1");
  });

  it("writes time zone offsets as EPCIS wants them", () => {
    expect(formatOffset(60)).toBe("+01:00");
    expect(formatOffset(-330)).toBe("-05:30");
    expect(kgOf(50_125)).toBe(50.125);
  });
});

describe("a trace answer's events", () => {
  it("backward from a product lot covers its paths from the origins, not the glycerol tank or the other batch", () => {
    const scope = backwardScope(M, 8, [1, 2, 5, 6]);
    expect([...scope].sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    const doc = build(GS1, { period: undefined, scope });
    expect(EpcisDocumentSchema.safeParse(doc).success).toBe(true);
    const ids = doc.epcisBody.eventList.map((e) => e.eventID.replace(/.*\/event\//, ""));
    expect(ids).toContain("batch/B-1");
    expect(ids).not.toContain("move/15");
    expect(
      doc.epcisBody.eventList.some((e) => e.destinationList?.some((d) => (d.destination ?? "").includes("T-GLY"))),
    ).toBe(false);
  });

  it("forward keeps only holders downstream of the entries", () => {
    expect([...forwardScope(M, [1], [3, 4, 9, 13])].sort((a, b) => a - b)).toEqual([1, 3, 4, 9]);
  });
});

describe("the EPCIS 2.0 rules we check against", () => {
  const valid = () => structuredClone(build());
  const first = (d: EpcisDocument) => d.epcisBody.eventList[0] as unknown as Record<string, unknown>;
  it.each<[string, (d: EpcisDocument) => void]>([
    ["an event without eventTimeZoneOffset", (d) => void delete first(d).eventTimeZoneOffset],
    ["an offset beyond +14:00", (d) => void (first(d).eventTimeZoneOffset = "+15:00")],
    [
      "a unit that is not a UN/CEFACT code",
      (d) => void ((first(d).quantityList as Array<Record<string, unknown>>)[0]!.uom = "kg"),
    ],
    ["an ObjectEvent without epcList or quantities", (d) => void delete first(d).quantityList],
    ["ilmd with action OBSERVE", (d) => void (first(d).ilmd = { "tv:note": "x" })],
    ["an extension field without a namespace", (d) => void (first(d).note = "x")],
    ["a long-form CBV business step", (d) => void (first(d).bizStep = "urn:epcglobal:cbv:bizstep:receiving")],
    [
      "a relative URI as a class",
      (d) => void ((first(d).quantityList as Array<Record<string, unknown>>)[0]!.epcClass = "lot L-1"),
    ],
    [
      "a transformation with inputs only and no transformationID",
      (d) => {
        const e = d.epcisBody.eventList.find((x) => x.type === "TransformationEvent") as unknown as Record<
          string,
          unknown
        >;
        delete e.outputQuantityList;
        delete e.transformationID;
      },
    ],
  ])("refuses %s", (_, spoil) => {
    const d = valid();
    expect(EpcisDocumentSchema.safeParse(d).success).toBe(true);
    spoil(d);
    expect(EpcisDocumentSchema.safeParse(d).success).toBe(false);
  });
});
