import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import type { Result } from "@/lib/core/result";
import { transferToTank } from "@/lib/tank/tank.service";
import { completeBatch, planBatch, receiveReagent, startBatch } from "@/lib/batch/batch.service";
import { createCustomer } from "@/lib/customer/customer.service";
import { recordShipment } from "@/lib/shipment/shipment.service";
import { listRecordHistory } from "@/lib/audit/audit.store";
import { getBalanceReport } from "@/lib/mass-balance/balance.service";
import { getLotDetail } from "@/lib/feedstock/lot-detail.store";
import { getLotFlow } from "@/lib/feedstock/lot-flow.service";
import { holdRecalledProductLots, recallReport } from "@/lib/trace/recall.service";
import { traceBackwardReport } from "@/lib/trace/trace.service";
import { getLedgerVersion } from "@/lib/trace/trace.store";
import { buildRecallDoc } from "@/lib/trace/recall-report";
import { kgText, sumColumn } from "@/lib/report/report";
import type { ReportContext, ReportDoc, ReportTable } from "@/lib/report/report";
import { reportCsv } from "@/lib/report/report-csv";
import { renderReportPdf } from "@/lib/report/report-pdf";
import { buildBalanceDoc } from "@/app/balance/balance-report";
import { buildLotHistoryDoc } from "@/app/lots/[code]/lot-report";
import { buildBackwardTraceDoc } from "@/app/trace/trace-report";
import { openWasteContainer } from "@/lib/waste/container.service";
import { getCustodyReport } from "@/lib/custody/custody.service";
import { getWasteDueReport } from "@/app/waste/due/due-report";
import { buildWasteListDoc } from "@/app/waste/due/waste-list-report";
import { buildCustodyDoc } from "@/app/balance/custody/custody-report";
import { pdfText } from "../support/pdf-text";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}

const NOW = new Date("2026-03-01T12:00:00Z");
const CTX: ReportContext = { plant: "Test Works, Testford", producedAt: NOW, producedBy: "q", timeZone: "UTC" };

/** The CSV's data rows and its TOTAL row; papaparse skips the "#" header lines. */
function csvOf(
  doc: ReportDoc,
  table: ReportTable,
): { rows: Array<Record<string, string>>; total: Record<string, string> | undefined; comments: string } {
  const text = reportCsv(doc, table);
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, comments: "#", skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  const first = table.columns[0]!.key;
  return {
    rows: parsed.data.filter((r) => r[first] !== "TOTAL"),
    total: parsed.data.find((r) => r[first] === "TOTAL"),
    comments: text
      .split("\r\n")
      .filter((l) => l.startsWith("#"))
      .join("\n"),
  };
}
const grams = (kg: string | undefined) => Math.round(Number(kg ?? "NaN") * 1000);

/** Each mass column's rows sum to its total row, in the data, the CSV and the PDF text. */
async function expectTotalsAgree(
  doc: ReportDoc,
  keys: ReadonlyArray<readonly [table: string, column: string]>,
): Promise<void> {
  const text = await pdfText(await renderReportPdf(doc));
  expect(text).toContain(doc.plant);
  expect(text).toContain(`last movement no. ${doc.ledger.lastMoveId}`);
  for (const [tableKey, column] of keys) {
    const table = doc.tables.find((t) => t.key === tableKey)!;
    const i = table.columns.findIndex((c) => c.key === column);
    const totalG = table.total?.[i] as number;
    expect(sumColumn(table, column), `${tableKey}.${column}: rows add up to the total`).toBe(totalG);
    const csv = csvOf(doc, table);
    expect(csv.comments).toContain(`last movement no. ${doc.ledger.lastMoveId}`);
    expect(csv.rows.reduce((s, r) => s + grams(r[`${column}_kg`]), 0)).toBe(totalG);
    expect(grams(csv.total?.[`${column}_kg`])).toBe(totalG);
    expect(text, `${tableKey}.${column} total printed in the PDF`).toContain(kgText(totalG, true));
  }
}

// Reports leave the building: a source's oil of some days followed to its customers and held on site,
// and each report (recall, trace, balance, lot history) as CSV and PDF with the same totals as its data.
describe.each(PROVIDERS)("recall and reports on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    await acceptedLot(t.db, plant, { lot: "L-1", pickup: "PU-1", day: 10, volumeL: 400 });
    await acceptedLot(t.db, plant, { lot: "L-2", pickup: "PU-2", day: 12, volumeL: 400 });
    for (const [lot, day] of [
      ["L-1", "11"],
      ["L-2", "13"],
    ] as const) {
      value(
        await transferToTank(t.db, plant.production, {
          fromKind: "LOT",
          fromCode: lot,
          toTankCode: "T1",
          at: `2026-02-${day}T08:00:00Z`,
          massKg: 300,
        }),
      );
    }
    value(
      await receiveReagent(t.db, plant.production, {
        code: "MEOH-1",
        reagent: "METHANOL",
        supplier: "S",
        strengthPct: 99.9,
        receivedAt: "2026-02-01T08:00:00Z",
        massKg: 100,
      }),
    );
    value(
      await openWasteContainer(t.db, plant.compliance, {
        code: "GLY-1",
        stream: "GLYCEROL_PHASE",
        location: "Glycerol pad",
        accumulationStart: "2026-02-10T06:00:00Z",
        capacityL: 1000,
      }),
    );
    value(
      await planBatch(t.db, plant.production, {
        code: "B-1",
        plannedAt: "2026-02-14T07:00:00Z",
        targetOilKg: 400,
        catalyst: "KOH",
      }),
    );
    value(
      await startBatch(t.db, plant.production, {
        batchCode: "B-1",
        startedAt: "2026-02-14T08:00:00Z",
        charges: [
          { fromKind: "TANK", fromCode: "T1", role: "OIL", massKg: 400 },
          { fromKind: "REAGENT_LOT", fromCode: "MEOH-1", role: "METHANOL", massKg: 50 },
        ],
      }),
    );
    value(
      await completeBatch(t.db, plant.production, {
        batchCode: "B-1",
        completedAt: "2026-02-14T12:00:00Z",
        outputs: [
          { role: "ESTER", toKind: "PRODUCT_LOT", toCode: "P-1", massKg: 200 },
          { role: "ESTER", toKind: "PRODUCT_LOT", toCode: "P-2", massKg: 200 },
          { role: "GLYCEROL_PHASE", toKind: "WASTE_CONTAINER", toCode: "GLY-1", massKg: 30 },
          { role: "LOSS", massKg: 20, reason: "spilled at the drain valve" },
        ],
      }),
    );
    await t.db.productLot.update({
      where: { siteId_code: { siteId: plant.siteId, code: "P-1" } },
      data: { status: "RELEASED", releasedAt: new Date("2026-02-15T09:00:00Z") },
    });
    value(
      await createCustomer(t.db, plant.compliance, {
        code: "ACME-T",
        name: "Test Haulage",
        address: "1 Yard Row, Testford",
        contact: "Fuel desk",
      }),
    );
    value(
      await recordShipment(t.db, plant.compliance, {
        documentNo: "DOC-1",
        customerCode: "ACME-T",
        shippedAt: "2026-02-20T10:00:00Z",
        vehicle: "Tanker 7",
        compartment: "2",
        lines: [{ fromKind: "PRODUCT_LOT", fromCode: "P-1", massKg: 120 }],
      }),
    );
  });
  afterAll(async () => {
    await t.drop();
  });

  it("follows a source's pickups of the chosen days to the customer and what is still on site, every gram once", async () => {
    const r = value(
      await recallReport(
        t.db,
        plant.siteId,
        { kind: "SOURCE", code: "R1", from: "2026-02-10T00:00:00Z", to: "2026-02-11T00:00:00Z" },
        NOW,
        { withCustomers: true },
      ),
    );
    const pu1 = (
      await t.db.holder.findUniqueOrThrow({
        where: { siteId_kind_code: { siteId: plant.siteId, kind: "PICKUP", code: "PU-1" } },
        include: { incoming: true },
      })
    ).incoming;
    expect(r.seedMoves).toBe(1); // PU-1 only: PU-2 was observed on the 12th
    expect(r.tracedG).toBe(pu1[0]!.massG);
    // Conservation: what each place still holds (or shipped, hauled, lost) adds up to what was followed.
    expect(r.holders.reduce((s, h) => s + h.heldG, 0)).toBe(r.tracedG);
    expect(r.customers.map((c) => c.customer.name)).toEqual(["Test Haulage"]);
    expect(r.customers[0]!.grams).toBe(r.shippedG);
    expect(r.shippedG).toBeGreaterThan(0);
    expect(r.toHold.sort()).toEqual(["P-1", "P-2"]);
    expect(r.ledger.lastMoveId).toBe((await getLedgerVersion(t.db, plant.siteId)).lastId);

    const doc = buildRecallDoc(r, CTX, { withCustomers: true });
    await expectTotalsAgree(doc, [
      ["customers", "mass"],
      ["shipments", "mass"],
      ["product-lots", "received"],
      ["on-site", "held"],
    ]);
    const noCustomers = buildRecallDoc(r, CTX, { withCustomers: false });
    expect(noCustomers.tables.map((x) => x.key)).not.toContain("customers");
    expect(await pdfText(await renderReportPdf(noCustomers))).not.toContain("Test Haulage");
  });

  it("follows what went into a tank within a window only (a share of a mixture, not its whole origins)", async () => {
    const r = value(
      await recallReport(
        t.db,
        plant.siteId,
        { kind: "TANK", code: "T1", from: "2026-02-13T00:00:00Z", to: "2026-02-14T00:00:00Z" },
        NOW,
        { withCustomers: true },
      ),
    );
    expect(r.seedMoves).toBe(1);
    expect(r.tracedG).toBe(300_000); // the move of L-2 into T1 on the 13th
    expect(r.holders.reduce((s, h) => s + h.heldG, 0)).toBe(r.tracedG);
    // L-1 never reaches this answer: only the L-2 oil that entered T1 is followed.
    expect(r.holders.map((h) => h.holder.code)).not.toContain("L-1");
    expect(
      r.holders.find((h) => h.holder.code === "T1")!.heldG +
        r.holders.filter((h) => h.holder.kind !== "TANK").reduce((s, h) => s + h.heldG, 0),
    ).toBe(300_000);
  });

  it("puts every product lot reached on hold with the reason, each audited, all in one transaction", async () => {
    const reason = "Complaint 17: contaminated oil from R1";
    const held = value(
      await holdRecalledProductLots(t.db, plant.compliance, {
        kind: "SOURCE",
        code: "R1",
        from: "2026-02-10T00:00:00Z",
        to: "2026-02-11T00:00:00Z",
        reason,
      }),
    );
    expect(held.held.sort()).toEqual(["P-1", "P-2"]);
    for (const code of ["P-1", "P-2"]) {
      const lot = await t.db.productLot.findFirstOrThrow({ where: { code } });
      expect(lot).toMatchObject({ status: "HELD", decisionReason: reason });
      const history = await listRecordHistory(t.db, plant.siteId, "ProductLot", code);
      expect(history.some((e) => JSON.stringify(e).includes(reason))).toBe(true);
    }
    const short = await holdRecalledProductLots(t.db, plant.compliance, { kind: "SOURCE", code: "R1", reason: "no" });
    expect(short.ok ? null : short.issues[0]).toMatchObject({ field: "reason" });
    const none = await holdRecalledProductLots(t.db, plant.compliance, {
      kind: "SOURCE",
      code: "R1",
      from: "2026-01-01T00:00:00Z",
      to: "2026-01-02T00:00:00Z",
      reason,
    });
    expect(none.ok ? null : none.issues[0]?.code).toBe("RECALL.NOTHING_TO_HOLD");
  });

  it("prints the trace, balance and lot history with the same totals as their data", async () => {
    const version = await getLedgerVersion(t.db, plant.siteId);
    const ledger = { movements: version.count, lastMoveId: version.lastId };
    const back = value(await traceBackwardReport(t.db, plant.siteId, { kind: "PRODUCT_LOT", code: "P-2" }, NOW));
    const traceDoc = buildBackwardTraceDoc(back, CTX);
    await expectTotalsAgree(traceDoc, [
      ["sources", "mass"],
      ["lots", "mass"],
      ["pickups", "mass"],
    ]);
    expect(traceDoc.tables.find((x) => x.key === "sources")!.total![2]).toBe(200_000);

    const site = { id: plant.siteId, timeZone: "UTC" };
    const balance = value(await getBalanceReport(t.db, site, { period: "MONTH", year: "2026", month: "2" }, NOW));
    const balanceDoc = buildBalanceDoc(balance, CTX, ledger);
    const statement = balanceDoc.tables.find((x) => x.key === "statement")!;
    // Both sides of the statement are equal: what is unaccounted closes it.
    expect(statement.total![1]).toBe(statement.total![2]);
    expect(statement.total![1]).toBe(balance.inputsG);
    await expectTotalsAgree(balanceDoc, [
      ["statement", "in"],
      ["statement", "out"],
      ["batches", "inputs"],
    ]);

    const lot = (await getLotDetail(t.db, plant.siteId, "L-1"))!;
    const flow = await getLotFlow(t.db, plant.siteId, lot.holderId, NOW);
    const lotDoc = buildLotHistoryDoc(lot, flow, CTX, ledger);
    await expectTotalsAgree(lotDoc, [["pickups", "mass"]]);
    expect(await pdfText(await renderReportPdf(lotDoc))).toContain("Lot L-1");
  });

  it("prints the hauler's waste list with its cautions and the custody statement, totals as in their data", async () => {
    const version = await getLedgerVersion(t.db, plant.siteId);
    const site = { id: plant.siteId, timeZone: "UTC" };
    const waste = value(await getWasteDueReport(t.db, site, { days: "90", category: "", tsdfMiles: "" }, NOW));
    const wasteDoc = buildWasteListDoc(waste, CTX, { movements: version.count, lastMoveId: version.lastId });
    expect(wasteDoc.tables[0]!.rows.map((r) => r[0])).toEqual(["GLY-1"]);
    expect(wasteDoc.tables[0]!.total![3]).toBe(30_000);
    await expectTotalsAgree(wasteDoc, [
      ["containers", "mass"],
      ["due-by-stream", "mass"],
    ]);
    const text = await pdfText(await renderReportPdf(wasteDoc));
    expect(text).toContain("bonded and grounded"); // the glycerol phase's caution is printed with the list
    expect(text).toContain("safety data sheets");

    const custody = value(
      await getCustodyReport(t.db, site, { period: "2026-Q1", operatorType: "", claimKg: "", claimSet: "" }, NOW),
    );
    const custodyDoc = buildCustodyDoc(custody, CTX);
    await expectTotalsAgree(custodyDoc, [
      ["conversions", "oil"],
      ["conversions", "ester"],
    ]);
  });
});
