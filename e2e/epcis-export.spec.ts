import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import Database from "better-sqlite3";
import { prepareZXingModule, readBarcodes } from "zxing-wasm/reader";
import { plantDatabase } from "./support/plant";
import { expect, test } from "./support/test";
import type { Download, Page } from "@playwright/test";
import { signIn } from "./support/sign-in";
import { EpcisDocumentSchema } from "../lib/epcis/epcis-document.schema";
import type { EpcisDocument } from "../lib/epcis/epcis";

// Trading partners ask for GS1 EPCIS 2.0 files and labels their scanners read. Compliance downloads a
// balance period's events, production a trace answer's, and the administrator enters the plant's GS1
// Company Prefix so that labels and exports carry GS1 keys (and clears it again, leaving the demo as found).

async function downloadEpcis(page: Page): Promise<{ doc: EpcisDocument; name: string }> {
  const [download]: [Download, void] = await Promise.all([
    page.waitForEvent("download"),
    page.getByRole("link", { name: "EPCIS 2.0 events" }).click(),
  ]);
  const file = await download.path();
  const parsed = EpcisDocumentSchema.safeParse(JSON.parse(readFileSync(file, "utf8")));
  expect(parsed.success ? [] : parsed.error.issues, "the file follows the GS1 EPCIS 2.0.0 JSON Schema rules").toEqual(
    [],
  );
  return { doc: parsed.data as unknown as EpcisDocument, name: download.suggestedFilename() };
}

const grams = (list: Array<{ quantity: number }> | undefined) =>
  (list ?? []).reduce((s, q) => s + Math.round(q.quantity * 1000), 0);

test("compliance downloads the balance period as EPCIS events; batches reconcile with the balance", async ({
  page,
}) => {
  await signIn(page, "compliance.nell", "/balance");
  await expect(page.getByRole("heading", { name: /^Balance \d{4}-\d{2}/ })).toBeVisible();
  const { doc, name } = await downloadEpcis(page);
  expect(name).toMatch(/^epcis-.*\.json$/);
  const report = (await (await page.request.get("/api/balance")).json()) as {
    value: {
      period: { startsAt: string; endsAt: string };
      process: { completed: Array<{ code: string; inputsG: number }> };
    };
  };
  const start = Date.parse(report.value.period.startsAt);
  const end = Date.parse(report.value.period.endsAt);
  expect(doc.epcisBody.eventList.length).toBeGreaterThan(10);
  for (const e of doc.epcisBody.eventList) {
    expect(Date.parse(e.eventTime)).toBeGreaterThanOrEqual(start);
    expect(Date.parse(e.eventTime)).toBeLessThan(end);
  }
  const transformations = doc.epcisBody.eventList.filter((e) => e.type === "TransformationEvent");
  expect(transformations.length).toBe(report.value.process.completed.length);
  for (const b of report.value.process.completed) {
    const t = transformations.find((e) => e.transformationID?.endsWith(`/batch/${encodeURIComponent(b.code)}`));
    expect(grams(t?.inputQuantityList), `inputs of batch ${b.code}`).toBe(b.inputsG);
    expect(t?.inputQuantityList?.every((q) => q.uom === "KGM")).toBe(true);
  }
  // Compliance may see customers: every shipment names the customer it went to.
  for (const e of doc.epcisBody.eventList.filter((x) => x.bizStep === "shipping"))
    expect(e.destinationList?.[0]?.destination ?? "").toContain("/customer/");
});

test("production downloads the EPCIS events behind a product lot's trace, without customers", async ({ page }) => {
  const db = new Database(plantDatabase(), { readonly: true });
  const row = db
    .prepare(
      "SELECT p.code FROM ProductLot p JOIN Holder h ON h.id = p.holderId WHERE p.batchId IS NOT NULL ORDER BY p.id DESC LIMIT 1",
    )
    .get() as { code: string };
  db.close();
  await signIn(page, "production.tess", "/trace");
  const back = page.getByRole("group", { name: "What is in it? (backward)" });
  await back.getByLabel("Kind").selectOption("PRODUCT_LOT");
  await back.getByLabel("Code").fill(row.code);
  await back.getByRole("button", { name: "Trace back" }).click();
  await expect(page.getByRole("heading", { name: `What product lot ${row.code} is made of` })).toBeVisible();
  const { doc } = await downloadEpcis(page);
  const batch = doc.epcisBody.eventList.find(
    (e) => e.type === "TransformationEvent" && e.outputQuantityList?.some((q) => q.epcClass.endsWith(`/${row.code}`)),
  );
  expect(batch, "the batch that made the product lot").toBeTruthy();
  expect(doc.epcisBody.eventList.some((e) => e.bizStep === "collecting" || e.bizStep === "receiving")).toBe(true);
  expect(JSON.stringify(doc)).not.toContain("/customer/");
});

test("the administrator enters the GS1 Company Prefix; the lot label's DataMatrix and the export use GS1 keys", async ({
  page,
}) => {
  const db = new Database(plantDatabase(), { readonly: true });
  const lot = db.prepare("SELECT code FROM FeedstockLot ORDER BY id LIMIT 1").get() as { code: string };
  db.close();
  await signIn(page, "admin.jory", "/admin/site");
  const form = page.getByRole("form", { name: "GS1 Company Prefix" });
  await form.getByLabel("GS1 Company Prefix").fill("12AB");
  await form.getByLabel("Reason for the change").fill("Licence letter arrived");
  await form.getByRole("button", { name: "Save prefix" }).click();
  await expect(page.getByText("GS1 Company Prefix: 6 to 10 digits").first()).toBeVisible();
  try {
    await form.getByLabel("GS1 Company Prefix").fill("0614141");
    await form.getByLabel("Reason for the change").fill("Licence letter arrived");
    await form.getByRole("button", { name: "Save prefix" }).click();
    await expect(page.getByRole("status").filter({ hasText: "GS1 Company Prefix 0614141 saved" })).toBeVisible();
    await expect(page.getByRole("table", { name: /GTINs the plant uses/ })).toBeVisible();

    await page.goto(`/labels/lot/${encodeURIComponent(lot.code)}`);
    const symbol = page.getByRole("img", { name: `GS1 DataMatrix carrying lot ${lot.code}` });
    await expect(symbol).toBeVisible();
    const element = (await symbol.getAttribute("data-element-string")) ?? "";
    expect(element).toMatch(
      new RegExp(`^\\(01\\)00614141\\d{6}\\(10\\)${lot.code.replace(/[.*+?^${}()|[\]\\/]/g, "\\$&")}$`),
    );
    await expect(page.locator(".label-card.single")).toContainText(element);
    await page.screenshot({ path: "test-results/label-with-datamatrix.png" });
    // Read the printed symbol back as a scanner would: a general-purpose decoder on the screen image.
    const wasm = readFileSync(createRequire(import.meta.url).resolve("zxing-wasm/reader/zxing_reader.wasm"));
    void prepareZXingModule({
      overrides: { wasmBinary: wasm.buffer.slice(wasm.byteOffset, wasm.byteOffset + wasm.byteLength) as ArrayBuffer },
      fireImmediately: true,
    });
    await symbol.evaluate((el) => {
      (el as HTMLElement).style.width = "60mm";
      (el as HTMLElement).style.height = "60mm";
    });
    const [read] = await readBarcodes(new Uint8Array(await symbol.screenshot()), {
      formats: ["DataMatrix"],
      textMode: "HRI",
    });
    expect(read?.text).toBe(element); // GS1 General Specifications §3.2: (01) GTIN then (10) lot number

    const period = await page.request.get("/api/epcis/period");
    expect(period.status()).toBe(200);
    const doc = EpcisDocumentSchema.parse(await period.json());
    const classes = doc.epcisBody.eventList
      .flatMap((e) => [
        ...(e.type === "ObjectEvent"
          ? (e.quantityList ?? [])
          : [...(e.inputQuantityList ?? []), ...(e.outputQuantityList ?? [])]),
      ])
      .map((q) => q.epcClass);
    expect(classes.length).toBeGreaterThan(0);
    expect(classes.filter((c) => c.startsWith("urn:epc:class:lgtin:0614141.")).length).toBe(classes.length);
  } finally {
    await page.goto("/admin/site");
    await form.getByLabel("GS1 Company Prefix").fill("");
    await form.getByLabel("Reason for the change").fill("Demo plant has no licence");
    await form.getByRole("button", { name: "Save prefix" }).click();
    await expect(page.getByRole("status").filter({ hasText: "No GS1 Company Prefix" })).toBeVisible();
  }
});
