import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { withIdempotencyKey } from "@/lib/ledger/transaction.store";
import type { GridActor } from "@/lib/grid/grid.service";
import { importGridFile, listGridRows, saveGridRows } from "@/lib/grid/grid.service";
import { exportGrid } from "@/lib/grid/export.service";
import { GridExportSchema, GridQuerySchema } from "@/lib/grid/query.schema";
import readXlsxFile from "read-excel-file/node";
import Papa from "papaparse";

const pickup = (code: string, extra: Record<string, unknown> = {}) => ({
  code,
  sourceCode: "R1",
  material: "USED_COOKING_OIL",
  observedAt: "2026-03-05T09:00:00Z",
  containers: 2,
  volumeL: 180.5,
  tempC: 20,
  idempotencyKey: randomUUID(),
  ...extra,
});

describe.each(PROVIDERS)("grid batch saves and imports on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;
  let actor: GridActor;
  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    // The grid refuses pickups observed after now: these rows are dated 2026-03-05, after the test plant was set up.
    actor = { ...plant.production, now: new Date("2026-04-01T00:00:00Z"), role: "PRODUCTION", unitSystem: "metric" };
  });
  afterAll(async () => {
    await t.drop();
  });

  const counts = async () => ({
    pickups: await t.db.pickup.count(),
    audit: await t.db.auditEvent.count(),
    moves: await t.db.movement.count(),
  });

  it("saves all rows in one transaction and answers with the server's rows, computed mass included", async () => {
    const r = await saveGridRows(t.db, actor, {
      table: "pickups",
      rows: [
        { ref: "d1", input: pickup("G-1") },
        { ref: "d2", input: pickup("G-2", { volumeL: 20 }) },
      ],
    });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.saved.map((s) => s.row?.code)).toEqual(["G-1", "G-2"]);
    const mass = r.value.saved[0]?.row?.massKg;
    expect(typeof mass === "number" && mass > 150 && mass < 180.5).toBe(true); // oil is lighter than water: ~0.92 kg/L (common practice)
    expect(await t.db.auditEvent.count({ where: { entity: "Pickup", entityKey: { in: ["G-1", "G-2"] } } })).toBe(2);
  });

  it("writes nothing when one row of the batch is refused, and names the row and field", async () => {
    const before = await counts();
    const r = await saveGridRows(t.db, actor, {
      table: "pickups",
      rows: [
        { ref: "a", input: pickup("G-3") },
        { ref: "b", input: pickup("G-4", { sourceCode: "NOPE" }) },
      ],
    });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0]?.field).toBe("b.sourceCode");
    expect(r.issues[0]?.message).toMatch(/New row 2/);
    expect(await counts()).toEqual(before);
  });

  it("refuses a pickup observed hours after the server's clock, naming the row, and writes nothing", async () => {
    const before = await counts();
    const later = new Date(actor.now.getTime() + 3 * 3_600_000).toISOString();
    const r = await saveGridRows(t.db, actor, {
      table: "pickups",
      rows: [
        { ref: "f1", input: pickup("G-F1") },
        { ref: "f2", input: pickup("G-F2", { observedAt: later }) },
      ],
    });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0]?.code).toBe("PICKUP.IN_FUTURE");
    expect(r.issues[0]?.field).toBe("f2.observedAt");
    expect(r.issues[0]?.message).toMatch(/New row 2.*3 h later than now/);
    expect(await counts()).toEqual(before);
  });

  it("a preview runs the services and rolls back", async () => {
    const before = await counts();
    const r = await saveGridRows(t.db, actor, {
      table: "pickups",
      dryRun: true,
      rows: [{ ref: "p", input: pickup("G-5") }],
    });
    expect(r.ok && r.value.dryRun && r.value.saved[0]?.row?.code === "G-5").toBe(true);
    expect(await counts()).toEqual(before);
  });

  it("one idempotency key covers the whole batch: a retry is answered without writing again", async () => {
    const body = {
      table: "sources",
      rows: [
        { ref: "s1", input: { code: "K1", name: "Kitchen One", kind: "RESTAURANT", materials: ["USED_COOKING_OIL"] } },
        { ref: "s2", input: { code: "K2", name: "Kitchen Two", kind: "RESTAURANT", materials: ["TALLOW"] } },
      ],
    };
    const ctx = { userId: actor.userId, key: "grid-batch-0001", requestHash: "same" };
    const first = await withIdempotencyKey(ctx, () => saveGridRows(t.db, actor, body));
    const second = await withIdempotencyKey(ctx, () => saveGridRows(t.db, actor, body));
    expect(first.ok).toBe(true);
    expect(second).toEqual(first);
    expect(await t.db.source.count({ where: { code: { in: ["K1", "K2"] } } })).toBe(2);
  });

  it("refuses edits of ledger quantities on stored rows and read-only tables", async () => {
    const r = await saveGridRows(t.db, actor, {
      table: "pickups",
      rows: [],
      corrections: [{ ref: "x", rowId: "G-1", field: "volumeL", value: 10 }],
    });
    expect(r.ok ? "ok" : r.issues[0]?.code).toBe("GRID.NOT_CORRECTABLE");
    const b = await saveGridRows(t.db, actor, { table: "batches", rows: [{ ref: "x", input: {} }] });
    expect(b.ok ? "ok" : b.issues[0]?.code).toBe("GRID.READ_ONLY");
    const c = await saveGridRows(
      t.db,
      { ...actor, role: "COLLECTOR" },
      { table: "sources", rows: [{ ref: "x", input: {} }] },
    );
    expect(c.ok ? "ok" : c.issues[0]?.code).toBe("AUTH.FORBIDDEN");
  });

  it("pages, sorts, filters and totals on the server", async () => {
    const q = GridQuerySchema.parse({
      table: "pickups",
      start: "0",
      end: "10",
      sort: JSON.stringify([{ colId: "volumeL", sort: "asc" }]),
      filter: JSON.stringify({ volumeL: { filterType: "number", type: "lessThan", filter: 100 } }),
    });
    const page = await listGridRows(t.db, actor, q);
    expect(page.lastRow).toBe(1);
    expect(page.rows[0]?.code).toBe("G-2");
    expect(page.totals.volumeL).toBe(20);
    const us = await listGridRows(
      t.db,
      { ...actor, unitSystem: "us" },
      GridQuerySchema.parse({
        table: "pickups",
        filter: JSON.stringify({ volumeL: { filterType: "number", type: "lessThan", filter: 10 } }),
      }),
    );
    expect(us.lastRow).toBe(1); // 20 L = 5.28 US gal (NIST HB 44 App. C: 1 gal = 3.785411784 L)
  });

  it("imports a CSV all-or-nothing, names row and column, and a re-import of its export changes nothing", async () => {
    const bad = [
      "Pickup no.,Source,Material,Observed,Containers,Volume (gal),Oil temp. (°F)",
      'G-10,R1,used cooking oil,2026-03-06 10:00,1,"1,000",68',
      "G-11,R1,used cooking oil,2026-03-06 11:00,1,abc,68",
    ].join("\r\n");
    const before = await counts();
    const refused = await importGridFile(t.db, actor, { table: "pickups", text: bad });
    expect(refused.ok).toBe(false);
    if (!refused.ok) expect(refused.issues.map((i) => i.message).join("\n")).toMatch(/Row 3, column "Volume"/);
    expect(await counts()).toEqual(before);
    const good = bad.replace("abc", "55.5");
    const preview = await importGridFile(t.db, actor, { table: "pickups", text: good, dryRun: true });
    expect(preview.ok && preview.value.written === 2 && preview.value.failed === 0).toBe(true);
    expect(await counts()).toEqual(before);
    const done = await importGridFile(t.db, actor, { table: "pickups", text: good });
    expect(done.ok && done.value.written).toBe(2);
    const rows = await listGridRows(
      t.db,
      actor,
      GridQuerySchema.parse({
        table: "pickups",
        filter: JSON.stringify({ code: { filterType: "text", type: "equals", filter: "G-10" } }),
      }),
    );
    expect(rows.rows[0]?.volumeL).toBeCloseTo(3785.412, 3); // 1,000 US gal × 3.785411784 L (NIST HB 44 App. C), stored to the mL
    expect(rows.rows[0]?.tempC).toBeCloseTo(20, 6); // 68 °F = 20 °C (NIST SP 811 §B.8)
    const again = await importGridFile(t.db, actor, { table: "pickups", text: good });
    expect(again.ok && again.value.written === 0 && again.value.unchanged === 2).toBe(true);
    for (const system of ["metric", "us"] as const) {
      const file = await exportGrid(
        t.db,
        { ...actor, unitSystem: system },
        GridExportSchema.parse({ table: "pickups", format: "csv" }),
      );
      expect(file.ok).toBe(true);
      if (!file.ok) return;
      const text = new TextDecoder().decode(file.value.body);
      const round = await importGridFile(t.db, { ...actor, unitSystem: system }, { table: "pickups", text });
      expect(
        round.ok ? { written: round.value.written, unchanged: round.value.unchanged } : round.issues.slice(0, 3),
      ).toEqual({ written: 0, unchanged: 4 });
    }
    expect((await counts()).pickups).toBe(before.pickups + 2);
  });

  it("exports choices as labels with a code column, and times in site time with UTC beside; XLSX times are real date cells", async () => {
    await t.db.site.update({ where: { id: actor.siteId }, data: { timeZone: "Europe/Berlin" } });
    try {
      const filter = JSON.stringify({ code: { filterType: "text", type: "equals", filter: "G-1" } });
      const csv = await exportGrid(t.db, actor, GridExportSchema.parse({ table: "pickups", format: "csv", filter }));
      const xlsx = await exportGrid(t.db, actor, GridExportSchema.parse({ table: "pickups", format: "xlsx", filter }));
      expect(csv.ok && xlsx.ok).toBe(true);
      if (!csv.ok || !xlsx.ok) return;
      const parsed = Papa.parse<Record<string, string>>(
        new TextDecoder().decode(csv.value.body).replace(/^\uFEFF/, ""),
        { header: true, skipEmptyLines: true },
      );
      const row = parsed.data[0];
      expect(row?.["Material"]).toBe("Used cooking oil");
      expect(row?.["Material (code)"]).toBe("USED_COOKING_OIL");
      // 09:00 UTC on 5 March is 10:00 in Central European Time (UTC+1 in winter; IANA tz database, Europe/Berlin)
      expect(row?.["Observed (site time: Europe/Berlin)"]).toBe("2026-03-05 10:00");
      expect(row?.["Observed (UTC)"]).toBe("2026-03-05T09:00:00Z");
      // Read back with a general-purpose XLSX reader, not the library that wrote it.
      const sheets = await readXlsxFile(Buffer.from(xlsx.value.body));
      const rows = (sheets[0]?.data ?? []) as unknown[][];
      const header = rows[0] as string[];
      const local = rows[1]?.[header.indexOf("Observed (site time: Europe/Berlin)")];
      expect(local).toBeInstanceOf(Date);
      // A spreadsheet date holds no zone: the cell is the site's wall-clock time.
      expect((local as Date).toISOString()).toBe("2026-03-05T10:00:00.000Z");
      expect(rows[1]?.[header.indexOf("Material")]).toBe("Used cooking oil");
    } finally {
      await t.db.site.update({ where: { id: actor.siteId }, data: { timeZone: "UTC" } });
    }
  });

  it("filters a choice column by the label the grid shows", async () => {
    const byLabel = await listGridRows(
      t.db,
      actor,
      GridQuerySchema.parse({
        table: "pickups",
        filter: JSON.stringify({ material: { filterType: "text", type: "contains", filter: "cooking" } }),
      }),
    );
    const byCode = await listGridRows(
      t.db,
      actor,
      GridQuerySchema.parse({
        table: "pickups",
        filter: JSON.stringify({ material: { filterType: "text", type: "equals", filter: "USED_COOKING_OIL" } }),
      }),
    );
    expect(byLabel.lastRow).toBeGreaterThan(0);
    expect(byLabel.lastRow).toBe(byCode.lastRow);
    const none = await listGridRows(
      t.db,
      actor,
      GridQuerySchema.parse({
        table: "pickups",
        filter: JSON.stringify({ material: { filterType: "text", type: "contains", filter: "tallow" } }),
      }),
    );
    expect(none.lastRow).toBe(0);
  });
});
