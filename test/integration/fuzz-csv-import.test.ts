import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { importGridFile } from "@/lib/grid/grid.service";
import { GRID_TABLES, TABLE_KEYS } from "@/lib/grid/tables";
import { headerWithUnit } from "@/lib/grid/cells";

// Issue #6: the CSV import fuzzed with fast-check-generated malformed files (10,000 cases per database).
// Files are built from the real column headers (with and without units), junk headers, and cells that
// break RFC 4180 on purpose (stray quotes, separators, line breaks inside cells, formula starts, BOM,
// control characters). The import must never throw; a refusal names its code and field; every per-row
// message names the row; and whatever it does is all-or-nothing: stock still matches the ledger.
const TEXT = fc.oneof(
  fc.constantFrom(
    "",
    " ",
    '"',
    '""',
    'a"b',
    '"unclosed',
    "1,234.5",
    "1.234,5",
    "12,5",
    "-3",
    "1e9",
    "NaN",
    "2026-13-40",
    "31/02/2026",
    "2026-12-01T08:00:00Z",
    "R1",
    "T1",
    "USED_COOKING_OIL",
    "used cooking oil",
    "=1+1",
    "+SUM(A1)",
    "@cmd",
    "\uFEFF",
    "\u0000",
    "x\r\ny",
    "\t",
  ),
  fc.string({ maxLength: 12 }),
  fc.integer({ min: -1_000_000, max: 1_000_000 }).map(String),
  fc.double({ noNaN: false }).map(String),
);
const quoted = (c: string) => `"${c.replace(/"/g, '""')}"`;
/** A cell as written: bare, or quoted the RFC 4180 way (so a bare cell with a quote is malformed on purpose). */
const CELL = fc.tuple(TEXT, fc.boolean()).map(([c, q]) => (q ? quoted(c) : c));

const file = fc
  .record({
    table: fc.constantFrom(...TABLE_KEYS),
    extraHeaders: fc.array(fc.string({ maxLength: 8 }), { maxLength: 2 }),
    quoteHeaders: fc.boolean(),
    drop: fc.nat({ max: 5 }),
    units: fc.constantFrom<"metric" | "us">("metric", "us"),
    rows: fc.array(fc.array(CELL, { maxLength: 14 }), { maxLength: 5 }),
    bom: fc.boolean(),
    crlf: fc.boolean(),
    sep: fc.constantFrom(",", ";", "\t"),
    raw: fc.option(fc.string({ maxLength: 200 }), { freq: 5 }),
  })
  .map((f) => {
    if (f.raw !== null) return { table: f.table, text: f.raw };
    const table = GRID_TABLES[f.table];
    const headers = [
      ...table.columns
        .filter((c) => c.entry)
        .map((c) => headerWithUnit(c, f.units))
        .slice(f.drop),
      ...f.extraHeaders,
    ];
    const nl = f.crlf ? "\r\n" : "\n";
    const lines = [
      headers.map((h) => (f.quoteHeaders ? quoted(h) : h)).join(f.sep),
      ...f.rows.map((r) => r.join(f.sep)),
    ];
    return { table: f.table, text: `${f.bom ? "\uFEFF" : ""}${lines.join(nl)}` };
  });

describe.each(PROVIDERS)("malformed CSV files imported on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
  });
  afterAll(async () => {
    await t.drop();
  });

  it("never throws, names row and column, writes all or nothing (10,000 files)", async () => {
    const actor = { ...plant.production, role: "PRODUCTION" as const, unitSystem: "metric" as const };
    let refused = 0;
    let withMessages = 0;
    await fc.assert(
      fc.asyncProperty(file, fc.boolean(), async (f, dryRun) => {
        const r = await importGridFile(t.db, actor, { table: f.table, text: f.text, dryRun });
        if (!r.ok) {
          refused++;
          for (const issue of r.issues) {
            expect(issue.code).toMatch(/^[A-Z_]+\.[A-Z_0-9]+$/);
            expect(issue.message.length).toBeGreaterThan(3);
          }
          return;
        }
        if (r.value.failed > 0) {
          withMessages++;
          expect(r.value.written, "a file with a bad row writes nothing").toBe(0);
          expect(
            r.value.messages.some((m) => /row \d+/i.test(m)),
            r.value.messages.join(" | "),
          ).toBe(true);
        }
        if (dryRun) expect(r.value.written).toBe(0);
      }),
      { numRuns: 10_000, seed: 20261202 },
    );
    expect(refused + withMessages).toBeGreaterThan(100);
    const holders = await t.db.holder.findMany({ select: { id: true, stockG: true } });
    const moves = await t.db.movement.findMany({ select: { fromHolderId: true, toHolderId: true, massG: true } });
    for (const h of holders)
      expect(h.stockG).toBe(
        moves.reduce((s, m) => s + (m.toHolderId === h.id ? m.massG : 0) - (m.fromHolderId === h.id ? m.massG : 0), 0),
      );
  }, 900_000);
});
