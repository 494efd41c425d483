import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { acceptedLot, createTestPlant } from "./support/plant";
import type { Result } from "@/lib/core/result";
import { transferToTank } from "@/lib/tank/tank.service";
import { completeBatch, planBatch, receiveReagent, startBatch } from "@/lib/batch/batch.service";
import { closePeriod, openPeriod } from "@/lib/period/period.service";
import { changeCustomer, createCustomer } from "@/lib/customer/customer.service";
import { listCustomers } from "@/lib/customer/customer.store";
import { recordShipment } from "@/lib/shipment/shipment.service";
import { getShipmentRecord, listShipmentRows } from "@/lib/shipment/shipment.store";
import { listRecordHistory } from "@/lib/audit/audit.store";
import { traceForwardReport } from "@/lib/trace/trace.service";
import { forwardCsv } from "@/app/trace/csv";
import { DEFAULT_DENSITY_TABLE, densityAt, requireDensityEntry } from "@/lib/quantity/density";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}
function refusal<T>(r: Result<T>): { code: string; field?: string; message: string } {
  if (r.ok) throw new Error("expected a refusal");
  const i = r.issues[0];
  return { code: i?.code ?? "", message: i?.message ?? "", ...(i?.field === undefined ? {} : { field: i.field }) };
}

// Shipments: one shipment holder receives one movement per line, all in one transaction; only released
// product leaves the site; customers are records whose changes are audited with before and after.
describe.each(PROVIDERS)("shipments on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  const stock = async (kind: string, code: string) =>
    (await t.db.holder.findUniqueOrThrow({ where: { siteId_kind_code: { siteId: plant.siteId, kind, code } } })).stockG;
  const written = async () => ({
    shipments: await t.db.shipment.count(),
    holders: await t.db.holder.count({ where: { kind: "SHIPMENT" } }),
    moves: await t.db.movement.count(),
    audit: await t.db.auditEvent.count(),
  });
  const ship = (documentNo: string, lines: unknown[], extra: Record<string, unknown> = {}) =>
    recordShipment(t.db, plant.compliance, {
      documentNo,
      customerCode: "ACME-T",
      shippedAt: "2026-02-20T10:00:00Z",
      vehicle: "Tanker 7",
      compartment: "2",
      lines,
      ...extra,
    });

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    await acceptedLot(t.db, plant, { lot: "L-1", pickup: "PU-1", day: 10, volumeL: 400 });
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "LOT",
        fromCode: "L-1",
        toTankCode: "T1",
        at: "2026-02-11T08:00:00Z",
        massKg: 300,
      }),
    );
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
      await planBatch(t.db, plant.production, {
        code: "B-1",
        plannedAt: "2026-02-14T07:00:00Z",
        targetOilKg: 250,
        catalyst: "KOH",
      }),
    );
    value(
      await startBatch(t.db, plant.production, {
        batchCode: "B-1",
        startedAt: "2026-02-14T08:00:00Z",
        charges: [
          { fromKind: "TANK", fromCode: "T1", role: "OIL", massKg: 250 },
          { fromKind: "REAGENT_LOT", fromCode: "MEOH-1", role: "METHANOL", massKg: 50 },
        ],
      }),
    );
    value(
      await completeBatch(t.db, plant.production, {
        batchCode: "B-1",
        completedAt: "2026-02-14T12:00:00Z",
        outputs: [
          { role: "ESTER", toKind: "PRODUCT_LOT", toCode: "P-1", massKg: 100 },
          { role: "ESTER", toKind: "PRODUCT_LOT", toCode: "P-2", massKg: 100 },
          { role: "LOSS", massKg: 100, reason: "spilled at the decanter" },
        ],
      }),
    );
    // P-1 is released (the release screen is tested elsewhere); P-2 stays on hold.
    await t.db.productLot.update({
      where: { siteId_code: { siteId: plant.siteId, code: "P-1" } },
      data: { status: "RELEASED", releasedAt: new Date("2026-02-15T09:00:00Z") },
    });
    value(
      await transferToTank(t.db, plant.production, {
        fromKind: "PRODUCT_LOT",
        fromCode: "P-1",
        toTankCode: "P1",
        at: "2026-02-15T10:00:00Z",
        massKg: 40,
      }),
    );
    value(
      await createCustomer(t.db, plant.compliance, {
        code: "ACME-T",
        name: "Test Haulage",
        address: "1 Yard Row, Testford",
        contact: "Fuel desk",
      }),
    );
  });
  afterAll(async () => {
    await t.drop();
  });

  it("refuses a multi-line shipment whole when one line over-draws, naming the line", async () => {
    const before = await written();
    const r = refusal(
      await ship("DOC-1", [
        { fromKind: "PRODUCT_LOT", fromCode: "P-1", massKg: 30 },
        { fromKind: "TANK", fromCode: "P1", massKg: 41 },
      ]),
    );
    expect(r).toMatchObject({ code: "LEDGER.OVERDRAW", field: "lines.1.massKg" });
    expect(r.message).toMatch(/^Line 2: Tank P1 holds 40 kg; cannot draw 41 kg/);
    // Nothing half-written: the first line's draw, the shipment and its holder are all rolled back.
    expect(await written()).toEqual(before);
    expect(await stock("PRODUCT_LOT", "P-1")).toBe(60_000);
    expect(await stock("TANK", "P1")).toBe(40_000);
  });

  it("refuses a held product lot with the lot named, and a rejected one", async () => {
    const before = await written();
    expect(refusal(await ship("DOC-2", [{ fromKind: "PRODUCT_LOT", fromCode: "P-2", massKg: 10 }]))).toEqual({
      code: "PRODUCT.ON_HOLD",
      field: "lines.0.fromCode",
      message: "Product lot P-2 is on hold: it cannot leave the site until it is released",
    });
    expect(await written()).toEqual(before);
    expect(await stock("PRODUCT_LOT", "P-2")).toBe(100_000);
  });

  it("records a two-line shipment: one movement per line, mass the sum, customer name copied", async () => {
    // 20 L at 20 °C from the tank: m = V·ρ(20 °C), the fuel's density model (lib/quantity/density.ts, hand arithmetic).
    const rho20 = densityAt(requireDensityEntry(DEFAULT_DENSITY_TABLE, "FAME"), 20);
    const tankG = Math.round(20 * rho20);
    const saved = value(
      await ship(
        "DOC-3",
        [
          { fromKind: "PRODUCT_LOT", fromCode: "P-1", massKg: 25 },
          { fromKind: "TANK", fromCode: "P1", volumeL: 20, tempC: 20 },
        ],
        { certifiedClaim: true, note: "two compartments" },
      ),
    );
    expect(saved.massG).toBe(25_000 + tankG);
    expect(await stock("PRODUCT_LOT", "P-1")).toBe(35_000);
    expect(await stock("TANK", "P1")).toBe(40_000 - tankG);
    expect(await stock("SHIPMENT", "DOC-3")).toBe(25_000 + tankG);
    const detail = await getShipmentRecord(t.db, plant.siteId, "DOC-3");
    expect(detail).toMatchObject({
      customer: "Test Haulage",
      customerRef: { code: "ACME-T" },
      vehicle: "Tanker 7",
      compartment: "2",
      certifiedClaim: true,
      massG: 25_000 + tankG,
    });
    expect(detail?.lines.map((l) => [l.role, l.from?.code, l.massG, l.tempC])).toEqual([
      ["SHIPMENT", "P-1", 25_000, null],
      ["SHIPMENT", "P1", tankG, 20],
    ]);
    expect(
      (await listShipmentRows(t.db, plant.siteId, { customerCode: "ACME-T" })).rows.map((r) => r.documentNo),
    ).toEqual(["DOC-3"]);
    const customers = await listCustomers(t.db, plant.siteId);
    expect(customers.find((c) => c.code === "ACME-T")).toMatchObject({
      shipments: 1,
      lastShippedAt: new Date("2026-02-20T10:00:00Z"),
    });
  });

  it("refuses a used document number, an unknown customer and a date in a closed period", async () => {
    const line = [{ fromKind: "PRODUCT_LOT", fromCode: "P-1", massKg: 1 }];
    expect(refusal(await ship("DOC-3", line))).toMatchObject({ code: "RECORD.DUPLICATE", field: "documentNo" });
    expect(refusal(await ship("DOC-4", line, { customerCode: "NOBODY" }))).toMatchObject({
      code: "RECORD.NOT_FOUND",
      field: "customerCode",
    });
    const period = value(
      await openPeriod(t.db, plant.compliance, { startsAt: "2026-01-01T00:00:00Z", endsAt: "2026-02-01T00:00:00Z" }),
    );
    value(await closePeriod(t.db, plant.compliance, { periodId: period.id, reason: "month end" }));
    expect(refusal(await ship("DOC-5", line, { shippedAt: "2026-01-20T10:00:00Z" }))).toMatchObject({
      code: "PERIOD.CLOSED",
      field: "shippedAt",
    });
    expect(refusal(await ship("DOC-6", [{ fromKind: "TANK", fromCode: "T1", massKg: 1 }]))).toMatchObject({
      code: "SHIPMENT.NOT_PRODUCT_TANK",
      field: "lines.0.fromCode",
    });
    expect(refusal(await ship("DOC-7", [{ fromKind: "TANK", fromCode: "P1", volumeL: 5 }]))).toMatchObject({
      code: "INPUT.INVALID",
      field: "lines.0.tempC",
    });
  });

  it("audits a customer change with before and after; an inactive customer receives no shipment", async () => {
    expect(
      refusal(
        await changeCustomer(t.db, plant.compliance, {
          code: "ACME-T",
          name: "Test Haulage",
          address: "1 Yard Row, Testford",
          contact: "Fuel desk",
          active: true,
          reason: "no change",
        }),
      ).code,
    ).toBe("CUSTOMER.UNCHANGED");
    expect(
      refusal(
        await changeCustomer(t.db, plant.compliance, {
          code: "ACME-T",
          name: "Test Haulage Ltd",
          address: "1 Yard Row, Testford",
          contact: "Fuel desk",
          active: false,
          reason: "",
        }),
      ).field,
    ).toBe("reason");
    value(
      await changeCustomer(t.db, plant.compliance, {
        code: "ACME-T",
        name: "Test Haulage Ltd",
        address: "1 Yard Row, Testford",
        contact: "Fuel desk",
        active: false,
        reason: "Renamed; stopped buying",
      }),
    );
    const history = await listRecordHistory(t.db, plant.siteId, "Customer", "ACME-T");
    const change = history.at(-1);
    expect(change).toMatchObject({ action: "CHANGE", reason: "Renamed; stopped buying" });
    expect(JSON.parse(String(change?.before))).toEqual({ name: "Test Haulage", active: true });
    expect(JSON.parse(String(change?.after))).toEqual({ name: "Test Haulage Ltd", active: false });
    expect(refusal(await ship("DOC-8", [{ fromKind: "PRODUCT_LOT", fromCode: "P-1", massKg: 1 }])).code).toBe(
      "CUSTOMER.INACTIVE",
    );
    // The shipment keeps the name it was shipped under.
    expect((await getShipmentRecord(t.db, plant.siteId, "DOC-3"))?.customer).toBe("Test Haulage");
  });

  it("shows the customer next to each shipment a forward trace reaches, with a total per customer", async () => {
    const f = value(
      await traceForwardReport(t.db, plant.siteId, { kind: "LOT", code: "L-1" }, new Date("2026-03-01T00:00:00Z")),
    );
    const row = f.holders.find((h) => h.holder.kind === "SHIPMENT");
    expect(row?.customer).toEqual({ name: "Test Haulage", code: "ACME-T" });
    expect(f.byCustomer).toHaveLength(1);
    expect(f.byCustomer[0]).toMatchObject({ customer: { code: "ACME-T" }, shipments: 1, grams: row?.heldG });
    expect(row?.heldG).toBeGreaterThan(0);
    // The CSV of the same trace carries the customer in its last column.
    const csv = forwardCsv(f).split("\r\n");
    expect(csv[0]?.endsWith(",customer")).toBe(true);
    expect(csv.find((l) => l.includes(",DOC-3,"))?.endsWith(",Test Haulage")).toBe(true);
    // A reader the read matrix keeps from customers (production) gets the same trace without them.
    const plain = value(
      await traceForwardReport(t.db, plant.siteId, { kind: "LOT", code: "L-1" }, new Date("2026-03-01T00:00:00Z"), {
        withCustomers: false,
      }),
    );
    expect(plain.holders.some((h) => h.customer !== undefined)).toBe(false);
    expect(plain.byCustomer).toEqual([]);
    expect(forwardCsv(plain)).not.toContain("Test Haulage");
  });
});
