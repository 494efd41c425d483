import Papa from "papaparse";
import { expect, test } from "./support/test";
import type { APIRequestContext } from "@playwright/test";
import { signIn } from "./support/sign-in";

// A compliance user's questions, asked the way they would ask them: "what is this product lot made
// of?" and "where did this lot go?". The answers must reconcile with the records: the parts add up to
// the product lot's recorded mass (read independently through the holder API), the CSV download holds
// the same grams as the page, and the forward trace of a lot the backward trace found reaches the lot.

async function latestProductLot(request: APIRequestContext): Promise<{ code: string; grams: number }> {
  for (let n = 200; n > 0; n--) {
    const code = `P-${String(n).padStart(4, "0")}`;
    const res = await request.get(`/api/holders/PRODUCT_LOT/${code}`);
    if (res.status() === 200) {
      const body = (await res.json()) as { value: { stockG: number } };
      if (body.value.stockG > 0) return { code, grams: body.value.stockG };
    }
  }
  throw new Error("no product lot with stock in the demo plant");
}

function csvRows(text: string): Array<Record<string, string>> {
  const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
  expect(parsed.errors, "the CSV parses under RFC 4180").toEqual([]);
  return parsed.data;
}

test("trace a product lot back to its sources, download the table, and follow one lot forward", async ({ page }) => {
  await signIn(page, "compliance.nell", "/trace");
  const product = await latestProductLot(page.request);

  const back = page.getByRole("group", { name: "What is in it? (backward)" });
  await back.getByLabel("Kind").selectOption("PRODUCT_LOT");
  await back.getByLabel("Code").fill(product.code);
  await back.getByRole("button", { name: "Trace back" }).click();
  await expect(page.getByRole("heading", { name: `What product lot ${product.code} is made of` })).toBeVisible();
  // The graph is drawn (an SVG with the traced product lot in it).
  const graph = page.locator("svg").filter({ hasText: product.code }).first();
  await expect(graph).toBeVisible();

  // CSV of the by-source table: parts add up exactly to the recorded mass of the product lot.
  const csv = await page.request.get(`/trace/csv?dir=back&kind=PRODUCT_LOT&code=${product.code}&table=sources`);
  expect(csv.status()).toBe(200);
  expect(csv.headers()["content-disposition"]).toContain(".csv");
  const rows = csvRows(await csv.text());
  const total = rows.find((r) => r.source === "TOTAL");
  const parts = rows.filter((r) => r.source !== "TOTAL");
  expect(parts.length).toBeGreaterThan(1);
  const summed = parts.reduce((s, r) => s + Number(r.grams), 0);
  expect(summed).toBe(product.grams); // mass balance: every gram received is attributed once
  expect(Number(total?.grams)).toBe(product.grams);
  const pctSum = parts.reduce((s, r) => s + Number(r.percent), 0);
  expect(Math.abs(pctSum - 100)).toBeLessThan(0.01 * parts.length); // each percentage rounded to 4 decimals

  // The by-lot table names feedstock lots; follow the largest one forward.
  const lotRows = csvRows(
    await (await page.request.get(`/trace/csv?dir=back&kind=PRODUCT_LOT&code=${product.code}&table=lots`)).text(),
  );
  const feedLots = lotRows.filter((r) => /^L-\d+$/.test(r.lot ?? "")).sort((a, b) => Number(b.grams) - Number(a.grams));
  const lot = feedLots[0];
  expect(lot, "the product lot contains at least one feedstock lot").toBeDefined();
  const fwd = page.getByRole("group", { name: "Where did it go? (forward)" });
  await fwd.getByLabel("Kind").selectOption("LOT");
  await fwd.getByLabel("Code").fill(lot!.lot!);
  await fwd.getByRole("button", { name: "Trace forward" }).click();
  await expect(page.getByRole("heading", { name: new RegExp(`${lot!.lot}`) }).first()).toBeVisible();
  // The product lot we started from is among the places the lot reached, with the same grams.
  const fwdCsv = await page.request.get(`/trace/csv?dir=fwd&kind=LOT&code=${lot!.lot}&table=holders`);
  expect(fwdCsv.status()).toBe(200);
  const fwdText = await fwdCsv.text();
  expect(fwdText).toContain(product.code);
  const reached = csvRows(fwdText).find((r) => Object.values(r).includes(product.code));
  expect(reached, `forward trace of ${lot!.lot} lists ${product.code}`).toBeDefined();
  expect(Object.values(reached!)).toContain(lot!.grams);

  // Bad input: an unknown code is named, nothing else shown.
  await back.getByLabel("Code").fill("P-NO-SUCH");
  await back.getByRole("button", { name: "Trace back" }).click();
  await expect(back.getByRole("alert")).toContainText("P-NO-SUCH");
});
