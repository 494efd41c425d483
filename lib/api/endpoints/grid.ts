import type { EndpointDoc } from "@/lib/api/openapi";
import { GridExportSchema, GridImportSchema, GridQuerySchema, GridSaveSchema } from "@/lib/grid/query.schema";

/** The grid's endpoints: infinite-row-model reads, whole-view export, batch saves and CSV import. */
export const GRID_ENDPOINTS: EndpointDoc[] = [
  {
    method: "get",
    path: "/api/grid/rows",
    tag: "Grid",
    summary:
      "One block of a grid table, sorted and filtered on the server (sort, filter: JSON of the grid's models), with the filtered row count and mass/volume totals",
    input: GridQuerySchema,
  },
  {
    method: "get",
    path: "/api/grid/export",
    tag: "Grid",
    summary:
      "The whole filtered, sorted view as CSV (RFC 4180) or XLSX, units in the headers, formula-like text neutralised",
    input: GridExportSchema,
  },
  {
    method: "post",
    path: "/api/grid/save",
    tag: "Grid",
    summary:
      "Save new grid rows and corrections all-or-nothing through the record services; dryRun previews and rolls back (Idempotency-Key header required unless dryRun)",
    input: GridSaveSchema,
  },
  {
    method: "post",
    path: "/api/grid/import",
    tag: "Grid",
    summary:
      "Import a CSV file all-or-nothing; rows already stored with the same key and values are left alone; dryRun previews (Idempotency-Key header required unless dryRun)",
    input: GridImportSchema,
  },
];
