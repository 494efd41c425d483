import { describe, expect, it } from "vitest";
import {
  dueRowsByCode,
  estimateVolumeMl,
  SATELLITE_AREA,
  satelliteVolumeEvents,
  toDueInput,
} from "@/lib/waste/due-board";
import { listWasteDue } from "@/lib/waste/waste-due";

describe("the due board without the database", () => {
  it("estimates litres from grams at the stream's nominal density at 15 °C", () => {
    // water 999.1026 kg/m³ at 15 °C (Tanaka et al. 2001, Metrologia 38:301)
    expect(estimateVolumeMl("WASH_WATER", 999_103)).toBe(1_000_000);
    // methanol d(15/4) 0.7960 (Merck Index)
    expect(estimateVolumeMl("METHANOL_RICH", 796_000)).toBe(1_000_000);
    expect(estimateVolumeMl("NOT_A_STREAM", 999_103)).toBe(1_000_000);
  });

  it("turns movements into volume changes of the satellite containers only", () => {
    const at = new Date("2026-03-02T10:00:00Z");
    const holders = new Map([
      [11, "WASH_WATER"],
      [12, "METHANOL_RICH"],
    ]);
    const events = satelliteVolumeEvents(
      [
        { at, massG: 999_103, toHolderId: 11, fromHolderId: null },
        { at, massG: 796_000, toHolderId: 99, fromHolderId: 12 },
        { at, massG: 5, toHolderId: 98, fromHolderId: 97 },
        { at, massG: 999_103, toHolderId: 12, fromHolderId: 11 },
      ],
      holders,
    );
    expect(events).toEqual([
      { at: at.getTime(), deltaMl: 1_000_000 },
      { at: at.getTime(), deltaMl: -1_000_000 },
      { at: at.getTime(), deltaMl: 1_255_155 },
      { at: at.getTime(), deltaMl: -1_000_000 },
    ]);
  });

  it("reads a container on site as the rules do; only satellite containers carry the area's excess date", () => {
    const base = {
      code: "WC-7",
      stream: "GLYCEROL_PHASE",
      accumulationStart: new Date("2026-01-10T00:00:00Z"),
      stockG: 0,
      methanolPct: 12,
      pH: 10.5,
      flashPointC: null,
      waterPct: 20,
    };
    expect(toDueInput({ ...base, satellite: true }, 2, 1234)).toMatchObject({
      id: 3,
      satelliteAreaId: SATELLITE_AREA,
      satelliteExcessSinceAt: 1234,
      accumulationStartAt: Date.parse("2026-01-10T00:00:00Z"),
      characterisation: { methanolPct: 12, pH: 10.5, flashPointC: null, waterPct: 20 },
    });
    expect(toDueInput({ ...base, satellite: false }, 0, 1234)).toMatchObject({
      satelliteAreaId: null,
      satelliteExcessSinceAt: null,
    });
  });

  it("gives one row per container: dated ones with days left, undated ones without", () => {
    const start = Date.parse("2026-01-01T00:00:00Z");
    const report = listWasteDue({
      containers: [
        {
          id: 1,
          code: "WC-1",
          stream: "METHANOL_RICH",
          massG: 1000,
          volumeMl: 1200,
          accumulationStartAt: start,
          characterisation: { flashPointC: 11, aqueous: false, pH: 7 },
        },
        {
          id: 2,
          code: "WC-2",
          stream: "METHANOL_RICH",
          massG: 1000,
          volumeMl: 1200,
          accumulationStartAt: start,
          satelliteAreaId: SATELLITE_AREA,
          characterisation: { flashPointC: 11, aqueous: false, pH: 7 },
        },
      ],
      site: { generatorCategory: "SQG", tsdfDistanceMiles: 10, utcOffsetMin: 0 },
      now: Date.parse("2026-06-20T00:00:00Z"),
      withinDays: 14,
    });
    if (!report.ok) throw new Error("report refused");
    const rows = dueRowsByCode(report.value);
    // 180 days for a small quantity generator, 40 CFR 262.16(b)
    expect(rows.get("WC-1")).toMatchObject({ limitDays: 180, dueDate: "2026-06-30", overdue: false, daysLeft: 10 });
    expect(rows.get("WC-2")).toMatchObject({ basis: "SATELLITE_NO_TIME_LIMIT", dueAt: null, daysLeft: null });
  });
});
