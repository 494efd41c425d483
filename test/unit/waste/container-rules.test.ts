import { describe, expect, it } from "vitest";
import {
  characterisationOf,
  checkCharacterise,
  checkHaul,
  checkMarkFull,
  STREAM_CAUTIONS,
} from "@/lib/waste/container-rules";
import { assessWasteHazards } from "@/lib/waste/waste-due";
import { WASTE_STREAMS } from "@/lib/core/vocabulary";

const start = new Date("2026-03-01T06:30:00Z");
const open = { code: "GLY-9", status: "OPEN", accumulationStart: start, stockG: 1_234_500 };

describe("mark full", () => {
  it("marks an open container full on or after its start", () => {
    expect(checkMarkFull(open, new Date("2026-03-05T10:00:00Z"))).toBeNull();
    expect(checkMarkFull(open, start)).toBeNull();
  });
  it("refuses a container already full or hauled away, and a date before the start", () => {
    expect(checkMarkFull({ ...open, status: "FULL" }, new Date("2026-03-05T10:00:00Z"))?.code).toBe(
      "WASTE.ALREADY_FULL",
    );
    expect(checkMarkFull({ ...open, status: "SHIPPED" }, new Date("2026-03-05T10:00:00Z"))?.code).toBe(
      "WASTE.ALREADY_HAULED",
    );
    expect(checkMarkFull(open, new Date("2026-02-28T23:59:00Z"))).toMatchObject({
      code: "WASTE.BEFORE_START",
      field: "fullAt",
    });
  });
});

describe("haul-away", () => {
  const at = new Date("2026-03-20T18:00:00Z");
  it("lets a hauler take part or all of what the container holds", () => {
    expect(checkHaul(open, { massG: 1_000_000, disposedAt: at })).toBeNull();
    expect(checkHaul(open, { massG: 1_234_500, disposedAt: at })).toBeNull();
  });
  it("refuses more than the container holds and names what it holds", () => {
    const issue = checkHaul(open, { massG: 1_234_501, disposedAt: at });
    expect(issue).toMatchObject({ code: "LEDGER.OVERDRAW", field: "massKg" });
    expect(issue?.message).toContain("holds 1,234.5 kg");
    expect(issue?.message).toContain("1,234.501 kg");
  });
  it("refuses a haul dated before the container started filling", () => {
    // Our ledger rule, not a regulatory figure: nothing leaves a container before it started filling.
    expect(checkHaul(open, { massG: 1000, disposedAt: new Date("2026-03-01T06:29:59Z") })).toMatchObject({
      code: "WASTE.BEFORE_START",
      field: "disposedAt",
    });
  });
  it("refuses a container already hauled away before anything else", () => {
    expect(checkHaul({ ...open, status: "SHIPPED", stockG: 0 }, { massG: 1000, disposedAt: at })?.code).toBe(
      "WASTE.ALREADY_HAULED",
    );
  });
});

describe("characterisation", () => {
  it("is refused once the container has left or before it started", () => {
    expect(checkCharacterise(open, new Date("2026-03-02T00:00:00Z"))).toBeNull();
    expect(checkCharacterise({ ...open, status: "SHIPPED" }, new Date("2026-03-02T00:00:00Z"))?.code).toBe(
      "WASTE.ALREADY_HAULED",
    );
    expect(checkCharacterise(open, new Date("2026-02-01T00:00:00Z"))?.field).toBe("testedAt");
  });
  it("feeds the hazard assessment: a glycerol phase flashing at 40 °C is ignitable", () => {
    // 40 CFR 261.21(a)(1): a liquid with a closed-cup flash point below 60 °C (140 °F) is ignitable
    const none = assessWasteHazards(
      "GLYCEROL_PHASE",
      characterisationOf({ methanolPct: null, pH: null, flashPointC: null, waterPct: null }),
    );
    expect(none.overall).toBe("NEEDS_CHARACTERISATION");
    const measured = assessWasteHazards(
      "GLYCEROL_PHASE",
      characterisationOf({ methanolPct: 12, pH: 10, flashPointC: 40, waterPct: 6 }),
    );
    expect(measured.ignitable.status).toBe("YES");
    expect(measured.overall).toBe("HAZARDOUS");
  });
});

describe("cautions", () => {
  it("every stream has its cautions; flammable streams say bond and ground, filter media says it can self-heat", () => {
    for (const s of WASTE_STREAMS) expect(STREAM_CAUTIONS[s].length).toBeGreaterThan(0);
    expect(STREAM_CAUTIONS.GLYCEROL_PHASE.join(" ")).toMatch(/bonded and grounded/);
    expect(STREAM_CAUTIONS.METHANOL_RICH.join(" ")).toMatch(/bonded and grounded/);
    expect(STREAM_CAUTIONS.FILTER_MEDIA.join(" ")).toMatch(/heat itself/);
    expect(STREAM_CAUTIONS.FILTER_MEDIA.join(" ")).toMatch(/closed metal bins/);
    expect(STREAM_CAUTIONS.WASH_WATER.join(" ")).toMatch(/methanol, soap/);
  });
});
