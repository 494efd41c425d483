import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { TestDb } from "./support/test-db";
import { createTestDb, PROVIDERS } from "./support/test-db";
import type { TestPlant } from "./support/plant";
import { createTestPlant } from "./support/plant";
import { createHolder } from "@/lib/ledger/ledger.store";
import { runInTransaction } from "@/lib/ledger/transaction.store";
import { chooseProductSpec, decideProductLot, recordQcResult } from "@/lib/product/product.service";
import { loadProductLotQc, productCertificatePdf } from "@/lib/product/certificate.service";
import { DEFAULT_PRODUCT_SPEC_KEY } from "@/lib/product/spec-default";
import { listRecordHistory } from "@/lib/audit/audit.store";
import { saveSiteSpec } from "@/lib/spec/site-spec.service";
import { statusFor } from "@/lib/http";
import type { Result } from "@/lib/core/result";
import { demoQcResults } from "@/seeds/qc";
import { pdfText } from "../support/pdf-text";

function value<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected success, got ${JSON.stringify(r.issues)}`);
  return r.value;
}
function refusal<T>(r: Result<T>): { code: string; field?: string; message: string; status: number } {
  if (r.ok) throw new Error("expected a refusal");
  const i = r.issues[0]!;
  return {
    code: i.code,
    ...(i.field === undefined ? {} : { field: i.field }),
    message: i.message,
    status: statusFor(r.issues),
  };
}

const TESTED = new Date("2026-02-13T09:00:00Z");

/** Every required property of the default specification (ASTM D6751-23a No. 2-B S15) inside its Table 1 limits. */
function passing(code: string) {
  return demoQcResults(code, TESTED, false);
}

describe.each(PROVIDERS)("QC and release of product lots on %s", (provider) => {
  let t: TestDb;
  let plant: TestPlant;

  async function productLot(code: string): Promise<void> {
    const r = await runInTransaction(t.db, async (tx) => {
      const holderId = await createHolder(tx, plant.siteId, "PRODUCT_LOT", code);
      await tx.productLot.create({
        data: {
          siteId: plant.siteId,
          holderId,
          code,
          producedAt: new Date("2026-02-12T15:00:00Z"),
          massG: 7_800_000,
          status: "HELD",
          specKey: DEFAULT_PRODUCT_SPEC_KEY,
        },
      });
    });
    value(r);
  }
  const qc = (code: string, property: string, v: number, extra: Record<string, unknown> = {}) =>
    recordQcResult(t.db, plant.production, {
      productLotCode: code,
      property,
      value: v,
      lab: "Site lab",
      reportNo: "R-1",
      testedAt: TESTED,
      ...extra,
    });
  const lot = (code: string) => t.db.productLot.findFirstOrThrow({ where: { code } });

  beforeAll(async () => {
    t = await createTestDb(provider);
    plant = await createTestPlant(t.db);
    for (const code of ["P-A", "P-B", "P-C", "P-D", "P-E"]) await productLot(code);
  });
  afterAll(async () => {
    await t.drop();
  });

  it("judges each result on entry against the lot's specification and keeps the limits as a snapshot", async () => {
    // ASTM D6751-23a Table 1: acid number 0.50 mg KOH/g max.
    const high = value(await qc("P-A", "acid-number", 0.52));
    expect(high.verdict).toBe("FAIL");
    const stored = await t.db.qcResult.findUniqueOrThrow({ where: { id: high.id } });
    expect(stored).toMatchObject({
      property: "acid-number",
      method: "ASTM D664",
      unit: "mg KOH/g",
      limitMax: 0.5,
      limitMin: null,
      specRef: "ASTM D6751-23a No. 2-B S15",
      verdict: "FAIL",
      pass: false,
      lab: "Site lab",
      reportNo: "R-1",
      supersedesId: null,
      recordedById: plant.production.userId,
    });
    // ASTM D6751-23a Table 1: flash point 93 °C min; cloud point is reported, not judged.
    expect(value(await qc("P-A", "flash-point", 93)).verdict).toBe("PASS");
    expect(value(await qc("P-A", "cloud-point", 4.5)).verdict).toBe("REPORTED");
    expect(value(await qc("P-A", "sulfur", 8, { method: "ASTM D7039" })).verdict).toBe("PASS"); // ASTM D6751-23a Table 1: S15 grades 15 ppm max
    expect((await t.db.qcResult.findFirstOrThrow({ where: { property: "sulfur" } })).method).toBe("ASTM D7039");
    expect(refusal(await qc("P-A", "iodine-value", 100))).toMatchObject({
      code: "QC.UNKNOWN_PROPERTY",
      field: "property",
    });
    expect(refusal(await qc("P-A", "acid-number", Number.NaN))).toMatchObject({
      code: "INPUT.INVALID",
      field: "value",
    });
    expect(refusal(await qc("NO-SUCH", "acid-number", 0.2))).toMatchObject({ field: "productLotCode" });
  });

  it("keeps a re-tested result on record, superseded by the new one", async () => {
    const first = await t.db.qcResult.findFirstOrThrow({
      where: { property: "acid-number", productLot: { code: "P-A" } },
    });
    const retest = value(await qc("P-A", "acid-number", 0.31));
    expect(retest).toMatchObject({ verdict: "PASS", supersedesId: first.id });
    expect(await t.db.qcResult.count({ where: { property: "acid-number", productLot: { code: "P-A" } } })).toBe(2);
    const view = await loadProductLotQc(t.db, plant.siteId, "P-A", TESTED);
    const row = view?.certificate?.rows.find((r) => r.key === "acid-number");
    expect(row).toMatchObject({ result: "0.31", verdict: "PASS" });
    expect(view?.detail.qc.find((q) => q.id === first.id)?.supersededById).toBe(retest.id);
  });

  it("refuses release while a required result is missing or out of limits (409), naming them", async () => {
    const missing = refusal(
      await decideProductLot(t.db, plant.compliance, { productLotCode: "P-A", decision: "RELEASE" }),
    );
    expect(missing).toMatchObject({ code: "PRODUCT.NOT_RELEASABLE", field: "decision", status: 409 });
    expect(missing.message).toMatch(/missing: .*water and sediment/);
    for (const r of passing("P-B")) value(await recordQcResult(t.db, plant.production, r));
    value(await qc("P-B", "acid-number", 0.52)); // ASTM D6751-23a Table 1: 0.50 mg KOH/g max — out of limits
    const failing = refusal(
      await decideProductLot(t.db, plant.compliance, { productLotCode: "P-B", decision: "RELEASE" }),
    );
    expect(failing).toMatchObject({ code: "PRODUCT.NOT_RELEASABLE", status: 409 });
    expect(failing.message).toMatch(/out of limits: acid number/);
    expect((await lot("P-B")).status).toBe("HELD");
  });

  it("needs the either-or alcohol control met: flash point of 130 °C or a methanol result", async () => {
    // ASTM D6751-23a Table 1: flash point 93 °C min; alcohol control is methanol 0.2 % mass max OR flash point 130 °C min.
    for (const r of passing("P-C"))
      value(await recordQcResult(t.db, plant.production, r.property === "flash-point" ? { ...r, value: 120 } : r));
    const refused = refusal(
      await decideProductLot(t.db, plant.compliance, { productLotCode: "P-C", decision: "RELEASE" }),
    );
    expect(refused.message).toMatch(/missing: alcohol control/);
    value(await qc("P-C", "methanol", 0.1));
    expect(
      value(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-C", decision: "RELEASE" })),
    ).toEqual({ code: "P-C", status: "RELEASED", deviation: false });
    const released = await lot("P-C");
    expect(released).toMatchObject({
      status: "RELEASED",
      deviation: false,
      decidedById: plant.compliance.userId,
      decisionReason: "",
    });
    expect(released.decidedAt?.toISOString()).toBe(plant.compliance.now.toISOString());
    expect(refusal(await qc("P-C", "acid-number", 0.2))).toMatchObject({ code: "PRODUCT.DECIDED", status: 409 });
    expect(
      refusal(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-C", decision: "RELEASE" })),
    ).toMatchObject({ code: "PRODUCT.DECIDED", status: 409 });
  });

  it("releases with a deviation only with a reason, stored, audited and printed on the certificate", async () => {
    expect(
      refusal(
        await decideProductLot(t.db, plant.compliance, {
          productLotCode: "P-B",
          decision: "RELEASE_WITH_DEVIATION",
          reason: "",
        }),
      ),
    ).toMatchObject({ code: "INPUT.INVALID", field: "reason" });
    const reason = "Customer accepts acid number 0.52 for boiler fuel use (written concession C-7).";
    value(
      await decideProductLot(t.db, plant.compliance, {
        productLotCode: "P-B",
        decision: "RELEASE_WITH_DEVIATION",
        reason,
      }),
    );
    expect(await lot("P-B")).toMatchObject({
      status: "RELEASED",
      deviation: true,
      decisionReason: reason,
      decidedById: plant.compliance.userId,
    });
    const history = await listRecordHistory(t.db, plant.siteId, "ProductLot", "P-B");
    expect(JSON.stringify(history)).toContain("written concession C-7");
    const pdf = await productCertificatePdf(t.db, plant.siteId, "P-B", new Date("2026-02-14T08:00:00Z"));
    expect(pdf?.filename).toBe("certificate-of-analysis-P-B.pdf");
    const text = await pdfText(pdf!.body);
    expect(text).toContain("P-B");
    expect(text).toContain("Released with a deviation");
    expect(text).toContain("written concession C-7");
    expect(text).toMatch(/Acid number\s+ASTM D664\s+0\.50 max\s+0\.52\s+mg KOH\/g\s+Fail/);
    expect(text).not.toContain("NOT RELEASED");
  });

  it("refuses a deviation when every result conforms", async () => {
    for (const r of passing("P-D")) value(await recordQcResult(t.db, plant.production, r));
    expect(
      refusal(
        await decideProductLot(t.db, plant.compliance, {
          productLotCode: "P-D",
          decision: "RELEASE_WITH_DEVIATION",
          reason: "not needed",
        }),
      ),
    ).toMatchObject({ code: "PRODUCT.NO_DEVIATION" });
  });

  it("re-judges against a newly chosen specification, and release uses the current one", async () => {
    const en = value(
      await chooseProductSpec(t.db, plant.compliance, { productLotCode: "P-D", specKey: "en-14214-2019/fame" }),
    );
    expect(en.releasable).toBe(false);
    expect(
      refusal(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-D", decision: "RELEASE" })),
    ).toMatchObject({ code: "PRODUCT.NOT_RELEASABLE" });
    expect(
      refusal(await chooseProductSpec(t.db, plant.compliance, { productLotCode: "P-D", specKey: "no-such/spec" })),
    ).toMatchObject({ code: "PRODUCT.UNKNOWN_SPEC", field: "specKey" });
    expect(
      value(
        await chooseProductSpec(t.db, plant.compliance, { productLotCode: "P-D", specKey: DEFAULT_PRODUCT_SPEC_KEY }),
      ).releasable,
    ).toBe(true);
    value(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-D", decision: "RELEASE" }));
  });

  it("judges against a site specification's tighter limits and names it on the certificate", async () => {
    await productLot("P-F");
    for (const r of passing("P-F"))
      value(await recordQcResult(t.db, plant.production, r.property === "acid-number" ? { ...r, value: 0.45 } : r));
    const site = value(
      await saveSiteSpec(t.db, plant.compliance, {
        baseKey: DEFAULT_PRODUCT_SPEC_KEY,
        name: "Harbour buyer",
        limits: { "acid-number": { min: null, max: 0.4 } },
        reason: "Buyer contract clause 4",
      }),
    );
    // ASTM D6751-23a Table 1 allows 0.50 mg KOH/g; the site's own copy allows 0.40, so 0.45 now fails.
    expect(
      value(await chooseProductSpec(t.db, plant.compliance, { productLotCode: "P-F", specKey: site.key })).releasable,
    ).toBe(false);
    expect(
      refusal(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-F", decision: "RELEASE" })).message,
    ).toMatch(/out of limits: acid number/);
    const view = await loadProductLotQc(t.db, plant.siteId, "P-F", TESTED);
    expect(view?.certificate?.specText).toBe(
      "Harbour buyer, version 1 (site specification based on ASTM D6751-23a No. 2-B S15)",
    );
    expect(value(await qc("P-F", "acid-number", 0.38)).verdict).toBe("PASS");
    expect((await t.db.qcResult.findFirstOrThrow({ where: { property: "acid-number", value: 0.38 } })).specRef).toBe(
      "Harbour buyer v1",
    );
    value(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-F", decision: "RELEASE" }));
  });

  it("holds and rejects with a reason; a released lot can be put back on hold", async () => {
    expect(
      refusal(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-E", decision: "REJECT" })),
    ).toMatchObject({ field: "reason" });
    value(
      await decideProductLot(t.db, plant.compliance, {
        productLotCode: "P-E",
        decision: "HOLD",
        reason: "Waiting for the contract lab",
      }),
    );
    expect(await lot("P-E")).toMatchObject({
      status: "HELD",
      decisionReason: "Waiting for the contract lab",
      decidedById: plant.compliance.userId,
    });
    value(
      await decideProductLot(t.db, plant.compliance, {
        productLotCode: "P-E",
        decision: "REJECT",
        reason: "Water haze; sent back to wash",
      }),
    );
    expect(await lot("P-E")).toMatchObject({ status: "REJECTED", decisionReason: "Water haze; sent back to wash" });
    expect(
      refusal(await decideProductLot(t.db, plant.compliance, { productLotCode: "P-E", decision: "HOLD", reason: "x" })),
    ).toMatchObject({ code: "PRODUCT.DECIDED", status: 409 });
    value(
      await decideProductLot(t.db, plant.compliance, {
        productLotCode: "P-D",
        decision: "HOLD",
        reason: "Customer complaint under review",
      }),
    );
    expect(await lot("P-D")).toMatchObject({
      status: "HELD",
      releasedAt: null,
      decisionReason: "Customer complaint under review",
    });
    const draft = await productCertificatePdf(t.db, plant.siteId, "P-D", new Date("2026-02-14T08:00:00Z"));
    expect(draft?.released).toBe(false);
    expect(await pdfText(draft!.body)).toContain("NOT RELEASED");
  });
});
