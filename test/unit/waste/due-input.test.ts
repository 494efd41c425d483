import { describe, expect, it } from "vitest";
import { validateDueInput } from "@/lib/waste/due-input";
import type { WasteContainerInput, WasteDueInput } from "@/lib/waste/due-input";

const container = (over: Partial<WasteContainerInput> = {}): WasteContainerInput => ({
  id: 1,
  code: "WC-1",
  stream: "WASH_WATER",
  massG: 10_000,
  volumeMl: 10_000,
  accumulationStartAt: Date.parse("2026-01-05T00:00:00Z"),
  characterisation: null,
  ...over,
});
const input = (over: Partial<WasteDueInput> = {}): WasteDueInput => ({
  containers: [container()],
  site: { generatorCategory: "SQG", tsdfDistanceMiles: 40, utcOffsetMin: -300 },
  now: Date.parse("2026-02-01T12:00:00Z"),
  withinDays: 14,
  ...over,
});
const fields = (i: WasteDueInput) => validateDueInput(i).map((x) => `${x.code} ${x.field ?? ""}`);

describe("checks of the due-date input", () => {
  it("a sound input has nothing to say", () => {
    expect(validateDueInput(input())).toEqual([]);
    expect(
      validateDueInput(input({ site: { generatorCategory: "LQG", tsdfDistanceMiles: null, utcOffsetMin: 840 } })),
    ).toEqual([]);
  });

  it("names every site-level problem by its field", () => {
    expect(
      fields(
        input({
          now: 1.5,
          withinDays: 3.5,
          site: { generatorCategory: "SQG", tsdfDistanceMiles: -1, utcOffsetMin: 841 },
        }),
      ),
    ).toEqual([
      "WASTE.INVALID_TIME now",
      "WASTE.INVALID_HORIZON withinDays",
      "WASTE.INVALID_DISTANCE site.tsdfDistanceMiles",
      "WASTE.INVALID_OFFSET site.utcOffsetMin",
    ]);
  });

  it("names each container's problems by its position, the message by its code", () => {
    const bad = container({
      code: "WC-9",
      stream: "MYSTERY" as WasteContainerInput["stream"],
      massG: 1.5,
      volumeMl: -1,
      accumulationStartAt: Number.NaN,
      satelliteExcessSinceAt: 0.5,
    });
    const issues = validateDueInput(input({ containers: [container(), bad] }));
    expect(issues.map((i) => i.field)).toEqual([
      "containers.1.stream",
      "containers.1.massG",
      "containers.1.volumeMl",
      "containers.1.accumulationStartAt",
      "containers.1.satelliteExcessSinceAt",
    ]);
    expect(issues.every((i) => i.message.startsWith("Container WC-9: "))).toBe(true);
  });

  it("holds characterisation values to the form's limits; blanks are allowed", () => {
    const c = container({ characterisation: { pH: 15, methanolPct: 101, flashPointC: null, waterPct: -1 } });
    expect(fields(input({ containers: [c] }))).toEqual([
      "WASTE.INVALID_PH containers.0.characterisation.pH",
      "WASTE.INVALID_METHANOL containers.0.characterisation.methanolPct",
      "WASTE.INVALID_WATER containers.0.characterisation.waterPct",
    ]);
  });
});
