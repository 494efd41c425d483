import { describe, expect, it } from "vitest";
import { GRID_TABLES } from "@/lib/grid/tables";
import {
  buildOrderBy,
  buildTableQuery,
  buildWhere,
  choiceFilter,
  conditionWhere,
  nest,
  siteScope,
  toStored,
} from "@/lib/grid/grid-query";
import type { RowsRequest } from "@/lib/grid/grid-query";

const pickups = GRID_TABLES.pickups;
const lots = GRID_TABLES.lots;
const col = (table: typeof pickups, field: string) => {
  const c = table.columns.find((x) => x.field === field);
  if (!c) throw new Error(`no column ${field}`);
  return c;
};
const request = (over: Partial<RowsRequest> = {}): RowsRequest => ({
  siteId: 7,
  table: "pickups",
  start: 100,
  end: 150,
  sort: [],
  filter: {},
  system: "metric",
  now: new Date("2026-03-01T00:00:00Z"),
  ...over,
});

describe("the grid's query, built without the database", () => {
  it("nests a dotted path around its leaf", () => {
    expect(nest("lot.code", { in: ["L-1"] })).toEqual({ lot: { code: { in: ["L-1"] } } });
    expect(nest("massG", null)).toEqual({ massG: null });
  });

  it("takes filter values in the user's units back to stored grams and millilitres", () => {
    expect(toStored(col(pickups, "massKg"), 1.5, "metric")).toBe(1500);
    expect(toStored(col(pickups, "volumeL"), 2, "metric")).toBe(2000);
    // 1 US gallon = 3.785411784 L (NIST Handbook 44, Appendix C)
    expect(toStored(col(pickups, "volumeL"), 1, "us")).toBe(3785);
    expect(toStored(col(pickups, "containers"), 3, "metric")).toBe(3);
  });

  it("matches a choice column by the label shown as well as the stored code", () => {
    const options = ["USED_COOKING_OIL", "TRAP_GREASE", "TALLOW"];
    expect(choiceFilter(options, "contains", "grease")).toEqual({ in: ["TRAP_GREASE"] });
    expect(choiceFilter(options, "equals", "tallow")).toEqual({ in: ["TALLOW"] });
    expect(choiceFilter(options, "notContains", "oil")).toEqual({ in: ["TRAP_GREASE", "TALLOW"] });
    expect(choiceFilter(options, "fuzzy", "oil")).toBeNull();
  });

  it("compares a mass in whole stored grams, a range either way round", () => {
    const w = conditionWhere(col(pickups, "massKg"), { filterType: "number", type: "equals", filter: 12.5 }, "metric");
    expect(w).toEqual({ massG: { equals: 12_500 } });
    const range = conditionWhere(
      col(pickups, "volumeL"),
      { filterType: "number", type: "inRange", filter: 20, filterTo: 10 },
      "metric",
    );
    expect(range).toEqual({ volumeMl: { gte: 10_000, lte: 20_000 } });
    expect(conditionWhere(col(pickups, "massKg"), { filterType: "number", type: "lessThan" }, "metric")).toBeNull();
  });

  it("upper-cases codes, keeps free text, and finds blanks", () => {
    expect(
      conditionWhere(col(pickups, "code"), { filterType: "text", type: "startsWith", filter: "pu-" }, "metric"),
    ).toEqual({ code: { startsWith: "PU-" } });
    expect(
      conditionWhere(col(pickups, "notes"), { filterType: "text", type: "contains", filter: "drum" }, "metric"),
    ).toEqual({ notes: { contains: "drum" } });
    expect(conditionWhere(col(pickups, "lotCode"), { filterType: "text", type: "blank" }, "metric")).toEqual({
      lot: { code: null },
    });
    expect(conditionWhere(col(pickups, "notes"), { filterType: "text", type: "notBlank" }, "metric")).toEqual({
      NOT: { notes: null },
    });
  });

  it("reads a date filter as whole days", () => {
    const day = { filterType: "date" as const, dateFrom: "2026-02-03 00:00:00" };
    const from = new Date("2026-02-03T00:00:00Z");
    const next = new Date("2026-02-04T00:00:00Z");
    expect(conditionWhere(col(pickups, "observedAt"), { ...day, type: "equals" }, "metric")).toEqual({
      observedAt: { gte: from, lt: next },
    });
    expect(conditionWhere(col(pickups, "observedAt"), { ...day, type: "notEqual" }, "metric")).toEqual({
      OR: [{ observedAt: { lt: from } }, { observedAt: { gte: next } }],
    });
    expect(
      conditionWhere(col(pickups, "observedAt"), { ...day, type: "inRange", dateTo: "2026-02-05" }, "metric"),
    ).toEqual({ observedAt: { gte: from, lt: new Date("2026-02-06T00:00:00Z") } });
    expect(conditionWhere(col(pickups, "observedAt"), { filterType: "date", type: "equals" }, "metric")).toBeNull();
  });

  it("ignores filters on unknown or computed-only columns and joins two conditions", () => {
    const where = buildWhere(
      lots,
      {
        nope: { filterType: "text", type: "contains", filter: "x" },
        pickupCodes: { filterType: "text", type: "contains", filter: "PU" },
        massKg: {
          filterType: "number",
          operator: "OR",
          conditions: [
            { filterType: "number", type: "lessThan", filter: 1 },
            { filterType: "number", type: "greaterThan", filter: 9 },
          ],
        },
      },
      "metric",
    );
    expect(where).toEqual([{ OR: [{ massG: { lt: 1000 } }, { massG: { gt: 9000 } }] }]);
  });

  it("sorts by the asked columns, else the table's default, always ending on the id", () => {
    expect(buildOrderBy(pickups, [{ colId: "sourceCode", sort: "asc" }])).toEqual([
      { source: { code: "asc" } },
      { id: "desc" },
    ]);
    expect(buildOrderBy(pickups, [])).toEqual([{ observedAt: "desc" }, { id: "desc" }]);
    expect(buildOrderBy(GRID_TABLES.sources, [{ colId: "unknown", sort: "desc" }])).toEqual([
      { code: "asc" },
      { id: "asc" },
    ]);
  });

  it("scopes rows to the site through the record that carries it", () => {
    expect(siteScope("pickups", 7)).toEqual({ siteId: 7 });
    expect(siteScope("titrations", 7)).toEqual({ lot: { siteId: 7 } });
    expect(siteScope("qcResults", 7)).toEqual({ productLot: { siteId: 7 } });
    expect(siteScope("batchFlows", 7)).toEqual({
      siteId: 7,
      OR: [{ fromHolder: { kind: "BATCH" } }, { toHolder: { kind: "BATCH" } }],
    });
  });

  it("turns a block request into skip, take and one WHERE", () => {
    const extra = { code: { in: ["PU-1"] } };
    const q = buildTableQuery(
      pickups,
      request({ filter: { code: { filterType: "text", type: "equals", filter: "pu-1" } }, extra }),
    );
    expect(q).toEqual({
      where: { AND: [{ siteId: 7 }, { code: { equals: "PU-1" } }, extra] },
      orderBy: [{ observedAt: "desc" }, { id: "desc" }],
      skip: 100,
      take: 50,
    });
  });
});
