import AxeBuilder from "@axe-core/playwright";
import Database from "better-sqlite3";
import QRCode from "qrcode";
import { randomUUID } from "node:crypto";
import { request as playwrightRequest } from "@playwright/test";
import { plantDatabase } from "./support/plant";
import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

test("receiving: two pickups pooled into one lot keep their link; a refusal names the field", async ({
  page,
  baseURL,
}) => {
  // The collector's two pickups this test receives (made here, not left over from another test).
  const src = new Database(plantDatabase(), { readonly: true });
  const source = (
    src
      .prepare("SELECT code FROM Source WHERE active = 1 AND materials LIKE '%USED_COOKING_OIL%' ORDER BY code LIMIT 1")
      .get() as { code: string }
  ).code;
  src.close();
  const collector = await playwrightRequest.newContext({ baseURL });
  expect(
    (await collector.post("/api/session", { data: { login: "collector.ivo", password: "quillmoor-demo" } })).status(),
  ).toBe(200);
  const tag = randomUUID().slice(0, 6).toUpperCase();
  for (const n of [1, 2]) {
    const key = randomUUID();
    const res = await collector.post("/api/pickups", {
      headers: { origin: baseURL!, "idempotency-key": key },
      data: {
        code: `PU-RCV-${tag}-${n}`,
        sourceCode: source,
        material: "USED_COOKING_OIL",
        observedAt: new Date(Date.now() - 3_600_000).toISOString(),
        containers: 1,
        volumeL: 120,
        tempC: 18,
        idempotencyKey: key,
      },
    });
    expect(res.status()).toBe(200);
  }
  await collector.dispose();
  await signIn(page, "production.tess", "/receiving");
  await expect(page.getByRole("heading", { name: "Receiving", level: 1 })).toBeVisible();
  await page.getByRole("button", { name: "Receive as one lot" }).click();
  await expect(page.locator("#err-pickups")).toHaveText("Pickups: choose at least one pickup");
  const axe = await new AxeBuilder({ page }).include("main").analyze();
  expect(axe.violations.map((v) => v.id)).toEqual([]);

  const db = new Database(plantDatabase(), { readonly: true });
  const two = db
    .prepare("SELECT code FROM Pickup WHERE lotId IS NULL AND code LIKE ? ORDER BY code")
    .all(`PU-RCV-${tag}-%`) as Array<{ code: string }>;
  db.close();
  expect(two).toHaveLength(2);
  for (const p of two) await page.getByLabel(`Take pickup ${p.code}`).check();
  const lotCode = await page.getByLabel("Lot number").inputValue();
  await page.getByLabel("Measured volume (L)").fill("0");
  await page.getByLabel("Temperature at measurement (°C)").fill("21");
  await page.getByRole("button", { name: "Receive as one lot" }).click();
  await expect(
    page
      .locator(".field")
      .filter({ has: page.getByLabel("Measured volume (L)") })
      .locator(".field-error"),
  ).toContainText("Observed volume (L) must be more than 0");
  await expect(page.getByLabel(`Take pickup ${two[0]!.code}`)).toBeChecked(); // nothing typed is lost
  await page.getByLabel("Measured volume (L)").fill("250");
  await page.getByRole("button", { name: "Receive as one lot" }).click();
  await expect(page.locator("p.form-ok")).toContainText(`Lot ${lotCode} received from 2 pickups`);

  const after = new Database(plantDatabase(), { readonly: true });
  const linked = after
    .prepare(`SELECT p.code, l.code AS lot FROM Pickup p JOIN FeedstockLot l ON l.id = p.lotId WHERE p.code IN (?, ?)`)
    .all(two[0]!.code, two[1]!.code) as Array<{ lot: string }>;
  after.close();
  expect(linked.map((r) => r.lot)).toEqual([lotCode, lotCode]);
  await page.goto(`/lots/${encodeURIComponent(lotCode)}`);
  await expect(page.getByText(two[0]!.code).first()).toBeVisible();
});

test("labels: lot sheet with GS1 (10) and a QR code of the record URL; container run; typed number opens the record", async ({
  page,
  baseURL,
}) => {
  await signIn(page, "production.tess", "/labels");
  const db = new Database(plantDatabase(), { readonly: true });
  const lots = db.prepare("SELECT code FROM FeedstockLot ORDER BY id LIMIT 2").all() as Array<{ code: string }>;
  db.close();
  await page.goto(`/labels?kind=lot&lot=${lots.map((l) => encodeURIComponent(l.code)).join("&lot=")}`);
  const first = page.locator(`.label-card[data-label="${lots[0]!.code}"]`);
  await expect(first).toContainText(`(10)${lots[0]!.code}`); // GS1 General Specifications, AI (10) element string
  await expect(page.locator(".label-card")).toHaveCount(2);
  const expected = await QRCode.toString(`${baseURL}/lots/${encodeURIComponent(lots[0]!.code)}`, {
    type: "svg",
    errorCorrectionLevel: "M",
    margin: 1,
  });
  const shown = await first.locator(".label-qr").innerHTML();
  const pathOf = (svg: string) => /<path[^>]*stroke[^>]* d="([^"]+)"/.exec(svg)?.[1];
  expect(pathOf(shown)).toBeTruthy();
  expect(pathOf(shown)).toBe(pathOf(expected));

  await page.screenshot({ path: "test-results/labels-lot-sheet.png", fullPage: true });
  const axe = await new AxeBuilder({ page }).include("main").analyze();
  expect(axe.violations.map((v) => v.id)).toEqual([]);
  await page.goto("/labels?kind=container&prefix=C-&from=7&to=9");
  await expect(page.locator(".label-card")).toHaveCount(3);
  await expect(page.locator('.label-card[data-label="C-0008"]')).toBeVisible();
  await page.goto("/labels?kind=container&prefix=C-&from=9&to=7");
  await expect(page.locator("p.form-error")).toContainText("To: a whole number not below From");

  await page.goto(`/labels/lot/${encodeURIComponent(lots[0]!.code)}`);
  await expect(page.locator(".label-card.single")).toContainText(`(10)${lots[0]!.code}`);

  await page.goto("/labels/scan");
  await page.getByLabel("Number on the label").fill(`(10)${lots[0]!.code.toLowerCase()}`);
  await page.getByRole("button", { name: "Open the record" }).click();
  await expect(page).toHaveURL(new RegExp(`/lots/${lots[0]!.code}$`));
  await page.goto("/labels/scan");
  await page.getByLabel("Number on the label").fill("NO-SUCH-9");
  await page.getByRole("button", { name: "Open the record" }).click();
  await expect(page.locator("p.form-error")).toContainText("Nothing at this site has the number NO-SUCH-9");
});

test("Scan: where the browser has BarcodeDetector, a read QR code opens the record", async ({ page, baseURL }) => {
  // Headless Chromium on Linux has no BarcodeDetector or camera: both are stood in for, so this checks our wiring.
  const target = `${baseURL}/labels/container/C-0042`;
  await page.addInitScript((url) => {
    class FakeDetector {
      async detect() {
        return [{ rawValue: url }];
      }
    }
    Object.assign(window, { BarcodeDetector: FakeDetector });
    const canvas = document.createElement("canvas");
    canvas.width = 8;
    canvas.height = 8;
    setInterval(() => canvas.getContext("2d")?.fillRect(0, 0, 8, 8), 100);
    Object.defineProperty(navigator, "mediaDevices", { value: { getUserMedia: async () => canvas.captureStream(5) } });
  }, target);
  await signIn(page, "collector.ivo", "/labels/scan");
  await page.getByRole("button", { name: "Scan" }).click();
  await expect(page).toHaveURL(/\/labels\/container\/C-0042$/);
  await expect(page.getByRole("heading", { name: "Container C-0042" })).toBeVisible();
});
