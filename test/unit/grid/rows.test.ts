import { describe, expect, it } from "vitest";
import { checkRow, isAddable, isBlankRow, ROW_KEY, schemaFor, toInput } from "@/lib/grid/rows";
import { GRID_TABLES } from "@/lib/grid/tables";
import { PickupSchema } from "@/lib/feedstock/pickup.schema";
import { DeliveryLotSchema, LotFromPickupsSchema } from "@/lib/feedstock/lot.schema";

const pickups = GRID_TABLES.pickups;

describe("grid rows → the shared schemas' input", () => {
  it("leaves empty cells out, splits lists and carries the row's idempotency key for pickups", () => {
    const input = toInput(pickups, {
      code: "PU-1",
      sourceCode: "R001",
      notes: "",
      containerTags: "C-1, C-2,,",
      [ROW_KEY]: "0d9c7a1e-0000-4000-8000-000000000001",
    });
    expect(input).toEqual({
      code: "PU-1",
      sourceCode: "R001",
      containerTags: ["C-1", "C-2"],
      idempotencyKey: "0d9c7a1e-0000-4000-8000-000000000001",
    });
  });

  it("never sends computed or read-only columns", () => {
    const input = toInput(pickups, { massKg: 900, lotCode: "L-1", receivedAt: "2026-12-01T08:00:00Z" });
    expect(input).toEqual({});
  });

  it("picks the lot schema by what was typed: supplier fields make a delivery, else pooled pickups", () => {
    expect(schemaFor("pickups", {})).toBe(PickupSchema);
    expect(schemaFor("lots", { supplierCode: "S1" })).toBe(DeliveryLotSchema);
    expect(schemaFor("lots", { pickupCodes: ["PU-1"] })).toBe(LotFromPickupsSchema);
    expect(isAddable("pickups")).toBe(true);
    expect(isAddable("shipments")).toBe(false);
  });

  it("puts each schema message on the cell of the field it names", () => {
    const r = checkRow(pickups, {
      code: "PU-1",
      sourceCode: "R001",
      observedAt: "2026-12-01T08:00:00Z",
      containers: 2,
      volumeL: -5,
      tempC: 400,
    });
    expect(r.ok).toBe(false);
    expect(r.errors.volumeL).toMatch(/Volume/);
    expect(r.errors.tempC).toMatch(/150 °C/);
    expect(r.errors.code).toBeUndefined();
  });

  it("a table the grid does not add to refuses the row as a whole", () => {
    const r = checkRow(GRID_TABLES.shipments, { code: "X" });
    expect(r).toMatchObject({ ok: false, errors: { "": "Shipments are not added in the grid" } });
  });

  it("a row is blank until something is typed in an entry cell", () => {
    expect(isBlankRow(pickups, { code: "", notes: null, massKg: 12 })).toBe(true);
    expect(isBlankRow(pickups, { notes: "x" })).toBe(false);
  });
});
