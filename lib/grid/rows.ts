// A grid row → the shared schema's input, and the schema's issues → messages on the cells they concern.
// The grid checks with the same zod schemas the API, the services and the seed loader use.
import { z } from "zod";
import type { ZodType } from "zod";
import { code, when } from "@/lib/core/fields";
import { SourceSchema } from "@/lib/source/source.schema";
import { PickupSchema } from "@/lib/feedstock/pickup.schema";
import { DeliveryLotSchema, LabTestSchema, LotFromPickupsSchema } from "@/lib/feedstock/lot.schema";
import { TitrationEntrySchema } from "@/lib/titration/titration.schema";
import type { CellValue, GridRow, GridTable, TableKey } from "@/lib/grid/tables";
import { entryColumns } from "@/lib/grid/tables";

/**
 * The same shape as LotTitrationSchema in lib/feedstock/titration.service.ts, built from the same field
 * builders; that file is server-only, so the browser cannot import it. The service parses again with its own.
 */
const LotTitrationEntrySchema = z
  .object({ lotCode: code("Lot number"), testedAt: when("Test time") })
  .and(TitrationEntrySchema);

export type AddableTable = Extract<TableKey, "sources" | "pickups" | "lots" | "titrations" | "labTests">;
export const ADDABLE: readonly AddableTable[] = ["sources", "pickups", "lots", "titrations", "labTests"];
export function isAddable(key: TableKey): key is AddableTable {
  return (ADDABLE as readonly string[]).includes(key);
}

/** Which shared schema a new row of this table is checked with. */
export function schemaFor(key: AddableTable, input: Record<string, unknown>): ZodType {
  switch (key) {
    case "sources":
      return SourceSchema;
    case "pickups":
      return PickupSchema;
    case "lots":
      return input.supplierCode !== undefined || input.deliveryDocument !== undefined
        ? DeliveryLotSchema
        : LotFromPickupsSchema;
    case "titrations":
      return LotTitrationEntrySchema;
    case "labTests":
      return LabTestSchema;
  }
}

const LIST_FIELDS = new Set(["materials", "containerTags", "pickupCodes"]);

/** Hidden row fields the grid keeps beside the cells. */
export const ROW_KEY = "__key";

/** The service input for a new row: empty cells are left out (schema defaults apply), lists become arrays. */
export function toInput(table: GridTable, row: GridRow): Record<string, unknown> {
  const input: Record<string, unknown> = {};
  for (const col of entryColumns(table)) {
    const v: CellValue | undefined = row[col.field];
    if (v === null || v === undefined || v === "") continue;
    if (LIST_FIELDS.has(col.field) && typeof v === "string")
      input[col.field] = v
        .split(",")
        .map((s) => s.trim())
        .filter((s) => s !== "");
    else input[col.field] = v;
  }
  if (table.key === "pickups" && typeof row[ROW_KEY] === "string") input.idempotencyKey = row[ROW_KEY];
  return input;
}

export interface RowCheck {
  ok: boolean;
  /** Message per field; "" key for a problem with the row as a whole. */
  errors: Record<string, string>;
  input: Record<string, unknown>;
}

/** Checks a new row with its shared schema; each message lands on the cell of the field it names. */
export function checkRow(table: GridTable, row: GridRow): RowCheck {
  const input = toInput(table, row);
  if (!isAddable(table.key)) return { ok: false, errors: { "": `${table.label} are not added in the grid` }, input };
  const parsed = schemaFor(table.key, input).safeParse(input);
  if (parsed.success) return { ok: true, errors: {}, input };
  const errors: Record<string, string> = {};
  const fields = new Set(table.columns.map((c) => c.field));
  for (const issue of parsed.error.issues) {
    const head = String(issue.path[0] ?? "");
    const field = fields.has(head) ? head : "";
    errors[field] = errors[field] ? `${errors[field]}; ${issue.message}` : issue.message;
  }
  return { ok: false, errors, input };
}

/** A row is a blank draft when nothing has been typed in it yet. */
export function isBlankRow(table: GridTable, row: GridRow): boolean {
  return entryColumns(table).every((c) => row[c.field] === null || row[c.field] === undefined || row[c.field] === "");
}
