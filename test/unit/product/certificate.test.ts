import { describe, expect, it } from "vitest";
import { buildCertificate, formatResult, specText } from "@/lib/product/certificate";
import type { CertificateInput, QcRecord } from "@/lib/product/certificate";
import { renderCertificatePdf, toWinAnsi } from "@/lib/product/certificate-pdf";
import { getBuiltInSpec } from "@/lib/spec/spec";
import type { Spec } from "@/lib/spec/spec";
import { DEFAULT_PRODUCT_SPEC_KEY } from "@/lib/product/spec-default";
import { demoQcResults } from "@/seeds/qc";
import { pdfText } from "../../support/pdf-text";

const TESTED = new Date("2026-02-13T09:00:00Z");

function spec(): Spec {
  const s = getBuiltInSpec(DEFAULT_PRODUCT_SPEC_KEY);
  if (!s) throw new Error("default specification missing");
  return s;
}

/** Every required property inside the ASTM D6751-23a Table 1 limits of No. 2-B S15 (the demo's values). */
function passingRecords(): QcRecord[] {
  return demoQcResults("P-9", TESTED, false).map((r, i) => ({
    id: i + 1,
    property: r.property,
    value: r.value,
    method: "",
    lab: "Site lab",
    reportNo: "QR-9",
    testedAt: TESTED,
    supersedesId: null,
  }));
}

function input(results: QcRecord[], lot: Partial<CertificateInput["lot"]> = {}): CertificateInput {
  return {
    plant: { name: "Test Works", town: "Testford" },
    timeZone: "UTC",
    lot: {
      code: "P-9",
      batchCode: "B-9",
      producedAt: new Date("2026-02-12T15:00:00Z"),
      massG: 7_812_345,
      status: "HELD",
      deviation: false,
      decisionReason: "",
      decidedAt: null,
      decidedBy: null,
      ...lot,
    },
    spec: spec(),
    results,
    generatedAt: new Date("2026-02-14T08:30:00Z"),
  };
}

describe("certificate of analysis data", () => {
  it("lists every property of the specification with its method, limit and unit, and names what is missing", () => {
    const c = buildCertificate(input([]));
    const acid = c.rows.find((r) => r.key === "acid-number");
    // ASTM D6751-23a Table 1: acid number, ASTM D664, 0.50 mg KOH/g max.
    expect(acid).toMatchObject({
      property: "Acid number",
      method: "ASTM D664",
      limit: "≤ 0.50",
      unit: "mg KOH/g",
      result: "",
      verdict: "MISSING",
      verdictText: "Missing",
    });
    expect(c.releasable).toBe(false);
    expect(c.missing).toContain("Acid number");
    expect(c.missing).toContain("Alcohol control");
    expect(c.specText).toBe(
      "ASTM D6751-23a No. 2-B S15: Biodiesel fuel blend stock (B100) for middle distillate fuels",
    );
    expect(c.lot.massKg).toBe(7812.345);
    expect(c.decision).toMatchObject({ status: "HELD", statusText: "On hold", by: null, deviation: false });
    expect(c.released).toBe(false);
  });

  it("is releasable with every required result in limits; the latest re-test counts", () => {
    const results = passingRecords();
    expect(buildCertificate(input(results)).releasable).toBe(true);
    const acid = results.find((r) => r.property === "acid-number")!;
    // ASTM D6751-23a Table 1: 0.52 mg KOH/g is above the 0.50 max.
    const failed = [...results, { ...acid, id: 100, value: 0.52, supersedesId: acid.id }];
    const c = buildCertificate(input(failed));
    expect(c.releasable).toBe(false);
    expect(c.failing).toEqual(["Acid number"]);
    expect(c.rows.find((r) => r.key === "acid-number")).toMatchObject({
      result: "0.52",
      verdict: "FAIL",
      verdictText: "Fail",
    });
    const retested = [...failed, { ...acid, id: 101, value: 0.3, supersedesId: 100 }];
    expect(buildCertificate(input(retested)).releasable).toBe(true);
  });

  it("shows report-only properties as reported, a class as its scale, a method the lab used instead of the spec's", () => {
    const results = passingRecords().map((r) => (r.property === "sulfur" ? { ...r, method: "ASTM D7039" } : r));
    const c = buildCertificate(input(results));
    expect(c.rows.find((r) => r.key === "cloud-point")).toMatchObject({
      verdict: "REPORTED",
      verdictText: "Reported",
      limit: "report",
    });
    expect(c.rows.find((r) => r.key === "copper-strip")).toMatchObject({
      result: "No. 1",
      limit: "No. 3 max",
      verdict: "PASS",
    });
    expect(c.rows.find((r) => r.key === "sulfur")?.method).toBe("ASTM D7039");
    expect(c.rows.find((r) => r.key === "methanol")).toMatchObject({
      result: "",
      verdictText: "Not tested",
      required: false,
    });
  });

  it("states the decision, who and when, and a deviation's reason", () => {
    const at = new Date("2026-02-14T08:00:00Z");
    const c = buildCertificate(
      input(passingRecords(), {
        status: "RELEASED",
        deviation: true,
        decisionReason: "Concession C-7",
        decidedAt: at,
        decidedBy: "Nell Varrowby",
      }),
    );
    expect(c.decision).toEqual({
      status: "RELEASED",
      statusText: "Released with a deviation",
      by: "Nell Varrowby",
      at,
      deviation: true,
      reason: "Concession C-7",
    });
    expect(c.released).toBe(true);
  });

  it("names a site specification with its version and base", () => {
    const s: Spec = { ...spec(), key: "site:1", siteSpec: { name: "Harbour grade", version: 2, reason: "customer" } };
    expect(specText(s)).toBe("Harbour grade, version 2 (site specification based on ASTM D6751-23a No. 2-B S15)");
  });

  it("formats results as the lab writes them", () => {
    expect(formatResult(0.52)).toBe("0.52");
    expect(formatResult(0.1 + 0.2)).toBe("0.3");
    expect(formatResult(0.0004)).toBe("0.0004");
    expect(formatResult(152.5)).toBe("152.5");
    expect(formatResult(-3)).toBe("-3");
  });
});

describe("certificate PDF", () => {
  it("maps signs the standard fonts cannot encode to words", () => {
    const font = {
      getCharacterSet: () =>
        Array.from("0123456789. -%°µ²/()ACFMabcdefghijklmnopqrstuvwxyzKOH?").map((c) => c.codePointAt(0)!),
    };
    expect(toWinAnsi("≤ 0.50", font)).toBe("0.50 max");
    expect(toWinAnsi("≥ 93", font)).toBe("93 min");
    expect(toWinAnsi("1.9 – 6.0", font)).toBe("1.9 - 6.0");
    expect(toWinAnsi("Methanol ≤ 0.2 % mass or Flash point ≥ 130 °C", font)).toBe(
      "Methanol 0.2 % mass max or Flash point 130 °C min",
    );
    expect(toWinAnsi("mm²/s", font)).toBe("mm²/s");
    expect(toWinAnsi("✓ ok", font)).toBe("? ok");
  });

  it("prints the lot, each result with its limit and verdict, and the decision; a lot not released says so", async () => {
    const released = buildCertificate(
      input(passingRecords(), {
        status: "RELEASED",
        decidedAt: new Date("2026-02-14T08:00:00Z"),
        decidedBy: "Nell Varrowby",
      }),
    );
    const text = await pdfText(await renderCertificatePdf(released));
    expect(text).toContain("Certificate of analysis");
    expect(text).toContain("Test Works, Testford");
    expect(text).toContain("P-9");
    expect(text).toContain("B-9");
    expect(text).toContain("7,812.3 kg");
    expect(text).toContain("ASTM D6751-23a No. 2-B S15");
    for (const row of released.rows.filter((r) => r.result !== "")) expect(text).toContain(row.result);
    expect(text).toMatch(/Flash point \(closed cup\)\s+ASTM D93\s+93 min\s+[\d.]+\s+°C\s+Pass/);
    expect(text).toContain("Released");
    expect(text).toContain("Nell Varrowby");
    expect(text).toContain("Generated 14 Feb 2026, 08:30 (UTC)");
    expect(text).not.toContain("NOT RELEASED");
    const held = await pdfText(await renderCertificatePdf(buildCertificate(input([]))));
    expect(held).toContain("NOT RELEASED");
    expect(held).toContain("Required results missing");
  });
});
