// The shape of a built-in specification table (lib/spec/editions/*.ts), checked when the module loads:
// a malformed table throws at import with the edition and the property named.
import { z } from "zod";

export interface SpecProperty {
  key: string;
  label: string;
  method: string;
  unit: string;
  kind: "limit" | "report" | "class";
  min?: number;
  max?: number;
  /** For class scales such as copper strip corrosion: the worst class still accepted. */
  classMax?: number;
  /** How a class is written, e.g. "No." (ASTM D130) or "Class" (EN ISO 2160). */
  classScale?: string;
  required: boolean;
  confidence: "published" | "check";
  note?: string;
  /** Decimal places the limit is written with ("0.50" → 2), for showing it as published. */
  decimals?: number;
  /** The published source of this row, with its edition, e.g. "ASTM D6751-23a Table 1". */
  source?: string;
  /** Set on a site specification's property whose limits the site changed. */
  siteLimit?: boolean;
}

/** e.g. alcohol control: methanol ≤ 0.2 % mass OR flash point ≥ 130 °C. */
export interface EitherOrRule {
  key: string;
  label: string;
  anyOf: Array<{ property: string; min?: number; max?: number }>;
}

export interface Spec {
  key: string;
  title: string;
  edition: string;
  grade: string;
  properties: SpecProperty[];
  rules: EitherOrRule[];
  siteSpec?: { name: string; version: number; reason: string };
  /** For a site specification: the built-in key it was copied from (used for source links). */
  baseKey?: string;
}

const slug = z.string().regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, "a lower-case slug such as acid-number");

export const EditionRowSchema = z
  .object({
    key: slug,
    label: z.string().min(1),
    method: z.string().min(1),
    unit: z.string(),
    kind: z.enum(["limit", "report", "class"]),
    min: z.number().finite().optional(),
    max: z.number().finite().optional(),
    classMax: z.number().int().positive().optional(),
    classScale: z.string().min(1).optional(),
    required: z.boolean(),
    confidence: z.enum(["published", "check"]),
    note: z.string().min(1).optional(),
    decimals: z.number().int().min(0).max(6).optional(),
    /** The published source with its edition, e.g. "ASTM D6751-23a Table 1". */
    source: z.string().min(1),
    /** Grade keys this row applies to; absent = every grade of the edition. */
    grades: z.array(z.string().min(1)).min(1).optional(),
  })
  .strict()
  .superRefine((row, ctx) => {
    if (row.kind === "limit" && row.min === undefined && row.max === undefined)
      ctx.addIssue({ code: "custom", message: "a limit row needs min or max", path: ["max"] });
    if (row.kind === "class" && (row.classMax === undefined || row.classScale === undefined))
      ctx.addIssue({ code: "custom", message: "a class row needs classMax and classScale", path: ["classMax"] });
    if (row.kind !== "limit" && (row.min !== undefined || row.max !== undefined))
      ctx.addIssue({ code: "custom", message: "only a limit row has min or max", path: ["kind"] });
    if (row.min !== undefined && row.max !== undefined && row.min > row.max)
      ctx.addIssue({ code: "custom", message: "min is above max", path: ["min"] });
  });

export const EditionRuleSchema = z
  .object({
    key: slug,
    label: z.string().min(1),
    anyOf: z
      .array(
        z.object({ property: slug, min: z.number().finite().optional(), max: z.number().finite().optional() }).strict(),
      )
      .min(2),
    source: z.string().min(1),
  })
  .strict();

export const EditionTableSchema = z
  .object({
    key: slug,
    title: z.string().min(1),
    edition: z.string().min(1),
    grades: z.array(z.object({ key: slug, grade: z.string().min(1), note: z.string().optional() }).strict()).min(1),
    rows: z.array(EditionRowSchema).min(1),
    rules: z.array(EditionRuleSchema),
  })
  .strict();

export type EditionRow = z.input<typeof EditionRowSchema>;
export type EditionTable = z.input<typeof EditionTableSchema>;

function issueText(table: unknown, path: ReadonlyArray<PropertyKey>, message: string): string {
  const rows = (table as { rows?: Array<{ key?: unknown }> }).rows;
  const [head, index, ...rest] = path;
  if (head === "rows" && typeof index === "number") {
    const key = rows?.[index]?.key;
    return `row ${index} (property ${typeof key === "string" ? key : "?"})${rest.length ? ` field ${rest.join(".")}` : ""}: ${message}`;
  }
  return `${path.join(".") || "table"}: ${message}`;
}

function gradeProperties(t: z.output<typeof EditionTableSchema>, gradeKey: string): SpecProperty[] {
  const props: SpecProperty[] = [];
  for (const row of t.rows) {
    if (row.grades !== undefined && !row.grades.includes(gradeKey)) continue;
    if (props.some((p) => p.key === row.key))
      throw new Error(`Specification table ${t.key}: property ${row.key} appears twice for grade ${gradeKey}`);
    const { grades: _grades, ...property } = row;
    props.push(property);
  }
  return props;
}

/** Checks a table and expands it into one Spec per grade. Throws naming the edition and property. */
export function loadEdition(table: unknown): Spec[] {
  const parsed = EditionTableSchema.safeParse(table);
  const name = (table as { key?: unknown }).key;
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    throw new Error(
      `Specification table ${typeof name === "string" ? name : "?"}: ${first ? issueText(table, first.path, first.message) : "invalid"}`,
    );
  }
  const t = parsed.data;
  const gradeKeys = new Set(t.grades.map((g) => g.key));
  for (const row of t.rows)
    for (const g of row.grades ?? [])
      if (!gradeKeys.has(g))
        throw new Error(`Specification table ${t.key}: property ${row.key} names unknown grade ${g}`);
  return t.grades.map((g) => {
    const properties = gradeProperties(t, g.key);
    for (const rule of t.rules)
      for (const alt of rule.anyOf)
        if (!properties.some((p) => p.key === alt.property))
          throw new Error(
            `Specification table ${t.key}: rule ${rule.key} names property ${alt.property}, absent from grade ${g.key}`,
          );
    const rules = t.rules.map(({ source: _source, ...rule }) => rule);
    return { key: `${t.key}/${g.key}`, title: t.title, edition: t.edition, grade: g.grade, properties, rules };
  });
}
