// The infinite row model's requests: which rows, sorted and filtered how. Filter values arrive in the
// user's display units (the grid's number filter shows gal or lb for US users) and are converted on the server.
import { z } from "zod";
import { TABLE_KEYS } from "@/lib/grid/tables";

export const MAX_BLOCK_ROWS = 500;

const condition = z.object({
  filterType: z.enum(["text", "number", "date"]),
  type: z.string().max(40),
  filter: z.union([z.string().max(200), z.number()]).nullish(),
  filterTo: z.number().nullish(),
  dateFrom: z.string().max(40).nullish(),
  dateTo: z.string().max(40).nullish(),
});
export type FilterCondition = z.infer<typeof condition>;

const columnFilter = z.union([
  condition,
  z.object({
    filterType: z.enum(["text", "number", "date"]),
    operator: z.enum(["AND", "OR"]),
    conditions: z.array(condition).max(5),
  }),
]);
export type ColumnFilter = z.infer<typeof columnFilter>;

const json = <T extends z.ZodType>(schema: T, what: string) =>
  z
    .string()
    .max(8000, `${what}: too long`)
    .transform((s, ctx) => {
      try {
        return JSON.parse(s) as unknown;
      } catch {
        ctx.addIssue({ code: "custom", message: `${what} must be JSON` });
        return z.NEVER;
      }
    })
    .pipe(schema);

export const SortSchema = z.array(z.object({ colId: z.string().max(60), sort: z.enum(["asc", "desc"]) })).max(5);
export const FilterSchema = z.record(z.string().max(60), columnFilter);

export const GridQuerySchema = z
  .object({
    table: z.enum(TABLE_KEYS, { error: `table must be one of: ${TABLE_KEYS.join(", ")}` }),
    start: z.coerce.number().int().min(0).default(0),
    end: z.coerce.number().int().min(1).default(100),
    sort: json(SortSchema, "sort").default([]),
    filter: json(FilterSchema, "filter").default({}),
  })
  .refine((q) => q.end > q.start && q.end - q.start <= MAX_BLOCK_ROWS, {
    message: `end must be after start, at most ${MAX_BLOCK_ROWS} rows per request`,
    path: ["end"],
  });
export type GridQuery = z.output<typeof GridQuerySchema>;

export const GridExportSchema = z.object({
  table: z.enum(TABLE_KEYS, { error: `table must be one of: ${TABLE_KEYS.join(", ")}` }),
  format: z.enum(["csv", "xlsx"], { error: "format must be csv or xlsx" }).default("csv"),
  sort: json(SortSchema, "sort").default([]),
  filter: json(FilterSchema, "filter").default({}),
});
export type GridExport = z.output<typeof GridExportSchema>;

/** A batch of new rows (typed or pasted) and corrections of stored rows, saved all-or-nothing. */
export const GridSaveSchema = z.object({
  table: z.enum(TABLE_KEYS, { error: `table must be one of: ${TABLE_KEYS.join(", ")}` }),
  /** Service inputs as the shared schemas take them; each is checked again by its service. */
  rows: z
    .array(z.object({ ref: z.string().max(80), input: z.record(z.string(), z.unknown()) }))
    .max(5_000, "rows: at most 5,000 per save"),
  corrections: z
    .array(
      z.object({ ref: z.string().max(80), rowId: z.string().max(80), field: z.string().max(60), value: z.unknown() }),
    )
    .max(1_000)
    .default([]),
  /** Check everything inside a transaction that is then rolled back: the preview. */
  dryRun: z.boolean().default(false),
});
export type GridSave = z.output<typeof GridSaveSchema>;

export const GridImportSchema = z.object({
  table: z.enum(TABLE_KEYS, { error: `table must be one of: ${TABLE_KEYS.join(", ")}` }),
  /** The file's text (the browser decodes the bytes: UTF-8 with or without BOM, else Latin-1). */
  text: z.string().max(12 * 1024 * 1024, "the file is larger than 10 MB"),
  locale: z.string().max(20).default("en"),
  dryRun: z.boolean().default(false),
});
export type GridImport = z.output<typeof GridImportSchema>;
