import { randomUUID } from "node:crypto";
import AxeBuilder from "@axe-core/playwright";
import Database from "better-sqlite3";
import { request as playwrightRequest } from "@playwright/test";
import { plantDatabase } from "./support/plant";
import { expect, test } from "./support/test";
import type { APIRequestContext, Page } from "@playwright/test";
import { signIn } from "./support/sign-in";

// Moves into tanks, gauge readings against the book, and receiving straight into a tank, as production
// staff do them on screen. Each journey makes its own pickups and lots; tanks are chosen at run time.

function readDb<T>(sql: string, ...args: unknown[]): T[] {
  const db = new Database(plantDatabase(), { readonly: true });
  try {
    return db.prepare(sql).all(...args) as T[];
  } finally {
    db.close();
  }
}

async function tankStockG(page: Page, code: string): Promise<number> {
  return (
    (await (await page.request.get(`/api/holders/TANK/${encodeURIComponent(code)}`)).json()) as {
      value: { stockG: number };
    }
  ).value.stockG;
}

/** Pickups made by the demo collector, an hour ago, for this journey only. */
async function newPickups(baseURL: string, tag: string, n: number, volumeL: number): Promise<string[]> {
  const source = readDb<{ code: string }>(
    "SELECT code FROM Source WHERE active = 1 AND materials LIKE '%USED_COOKING_OIL%' ORDER BY code LIMIT 1",
  )[0]!.code;
  const collector: APIRequestContext = await playwrightRequest.newContext({ baseURL });
  expect(
    (await collector.post("/api/session", { data: { login: "collector.ivo", password: "quillmoor-demo" } })).status(),
  ).toBe(200);
  const codes: string[] = [];
  for (let i = 1; i <= n; i++) {
    const key = randomUUID();
    const code = `PU-TM-${tag}-${i}`;
    const res = await collector.post("/api/pickups", {
      headers: { origin: baseURL, "idempotency-key": key },
      data: {
        code,
        sourceCode: source,
        material: "USED_COOKING_OIL",
        observedAt: new Date(Date.now() - 3_600_000).toISOString(),
        containers: 2,
        volumeL,
        tempC: 18,
        idempotencyKey: key,
      },
    });
    expect(res.status()).toBe(200);
    codes.push(code);
  }
  await collector.dispose();
  return codes;
}

/** The tank option with the most room, read from the select's own labels ("… room for about 12,345 kg"). */
async function roomiestTank(page: Page, selectName: string): Promise<{ code: string; roomKg: number }> {
  const options = await page
    .getByLabel(selectName)
    .locator("option")
    .evaluateAll((os) => os.map((o) => ({ value: (o as HTMLOptionElement).value, text: o.textContent ?? "" })));
  const rooms = options
    .filter((o) => o.value !== "")
    .map((o) => ({
      code: o.value,
      roomKg: Number((/room for about ([\d,]+) kg/.exec(o.text)?.[1] ?? "0").replace(/,/g, "")),
    }))
    .sort((a, b) => b.roomKg - a.roomKg);
  expect(rooms.length).toBeGreaterThan(0);
  return rooms[0]!;
}

test("a lot goes into a tank by volume at temperature; over-fill, over-draw and a closed period are refused on their fields", async ({
  page,
  baseURL,
}) => {
  const tag = randomUUID().slice(0, 6).toUpperCase();
  const [pickup] = await newPickups(baseURL!, tag, 1, 600);
  await signIn(page, "production.tess", "/receiving");
  await page.getByLabel(`Take pickup ${pickup}`).check();
  const lotCode = `L-TM-${tag}`;
  await page.getByLabel("Lot number").fill(lotCode);
  await page.getByLabel("Measured volume (L)").fill("600");
  await page.getByLabel("Temperature at measurement (°C)").fill("20");
  await page.getByRole("button", { name: "Receive as one lot" }).click();
  await expect(page.locator("p.form-ok")).toContainText(`Lot ${lotCode} received`);

  // Awaiting the lab, the lot page says why it cannot go into a tank yet.
  await page.goto(`/lots/${lotCode}`);
  await expect(page.getByText("A lot awaiting the lab cannot go into a tank yet")).toBeVisible();
  const headers = { origin: baseURL! };
  expect(
    (
      await page.request.post("/api/lab/titrations", {
        headers: { ...headers, "idempotency-key": randomUUID() },
        data: {
          lotCode,
          testedAt: new Date().toISOString(),
          sampleMassG: 7.05,
          titrant: "NAOH",
          concentrationMolL: 0.25,
          titreMl: 2,
          basis: "OLEIC",
        },
      })
    ).status(),
  ).toBe(200);
  expect(
    (
      await page.request.post("/api/lab/decisions", {
        headers: { ...headers, "idempotency-key": randomUUID() },
        data: { lotCode, status: "ACCEPTED" },
      })
    ).status(),
  ).toBe(200);

  await page.goto(`/lots/${lotCode}`);
  const form = page.getByRole("form", { name: "Move into a tank" });
  await expect(page.getByRole("complementary", { name: "Before pumping" })).toContainText("hot oil burns");
  await expect(page.getByRole("complementary", { name: "Before pumping" })).toContainText("valve line-up");
  const tank = await roomiestTank(page, "Into tank");
  await form.getByLabel("Into tank").selectOption(tank.code);
  const lotStockG = readDb<{ stockG: number }>(
    "SELECT h.stockG FROM Holder h WHERE h.kind = 'LOT' AND h.code = ?",
    lotCode,
  )[0]!.stockG;

  // Over-fill: more than the tank's room (checked first), refused on the mass field, typed value kept.
  const tooMuch = String(tank.roomKg + 5_000);
  await form.getByLabel("Or a mass (kg)").fill(tooMuch);
  await form.getByRole("button", { name: "Move" }).click();
  await expect(form.locator(".field-error")).toContainText(`Tank ${tank.code} has room for about`);
  await expect(form.getByLabel("Or a mass (kg)")).toHaveValue(tooMuch);
  // Over-draw: a volume whose mass is more than the lot holds, refused on the volume field.
  await form.getByLabel("Or a mass (kg)").fill("");
  await form.getByLabel("Or a volume (L)").fill("700");
  await form.getByLabel("Temperature of that volume (°C)").fill("40");
  await form.getByRole("button", { name: "Move" }).click();
  await expect(form.getByLabel("Or a volume (L)")).toHaveAttribute("aria-invalid", "true");
  await expect(form.locator(".field-error")).toContainText(`Feedstock lot ${lotCode} holds`);
  await expect(form.getByLabel("Temperature of that volume (°C)")).toHaveValue("40");
  // A closed period: months ended over a month ago are closed in the demo.
  const nowLocal = await form.getByLabel("Time of the move").inputValue();
  const old = new Date(Date.now() - 120 * 86_400_000).toISOString().slice(0, 16);
  await form.getByLabel("Time of the move").fill(old);
  await form.getByLabel("Or a volume (L)").fill("100");
  await form.getByRole("button", { name: "Move" }).click();
  await expect(form.locator(".field-error")).toContainText("is closed");
  await expect(form.getByLabel("Time of the move")).toHaveAttribute("aria-invalid", "true");

  // Part of the lot by volume at 40 °C: the page shows the conversion, the tank rises by that mass.
  await form.getByLabel("Time of the move").fill(nowLocal);
  await form.getByLabel("Or a volume (L)").fill("100");
  await form.getByLabel("Temperature of that volume (°C)").fill("40");
  await expect(form.getByText(/100 L at 40 °C × [\d.]+ kg\/m³ = [\d.,]+ kg/)).toBeVisible();
  const before = await tankStockG(page, tank.code);
  await form.getByRole("button", { name: "Move" }).click();
  await expect(form.getByRole("status")).toContainText(`into tank ${tank.code}`);
  await page.screenshot({ path: "/tmp/tank-moves-lot.png", fullPage: true });
  expect((await new AxeBuilder({ page }).include("main").analyze()).violations.map((v) => v.id)).toEqual([]);
  const after = await tankStockG(page, tank.code);
  // ρ(40 °C) = lot density at 15 °C − 0.64 × 25 (slope, JAOCS 76:1415–1419 (1999), in the density table).
  const lot = readDb<{ densityKgM3: number; referenceTempC: number }>(
    "SELECT densityKgM3, referenceTempC FROM FeedstockLot WHERE code = ?",
    lotCode,
  )[0]!;
  const expected = Math.round(100 * (lot.densityKgM3 - 0.64 * (40 - lot.referenceTempC)));
  expect(after - before).toBe(expected);
  expect(
    readDb<{ stockG: number }>("SELECT stockG FROM Holder WHERE kind = 'LOT' AND code = ?", lotCode)[0]!.stockG,
  ).toBe(lotStockG - expected);
  await page.reload();
  await expect(page.locator("section[aria-labelledby='went-h']")).toContainText(tank.code);
});

test("a gauge reading shows the book stock at its time beside it, and the difference", async ({ page }) => {
  const tank = readDb<{ code: string }>(
    "SELECT code FROM Tank WHERE service = 'FEEDSTOCK' AND strappingJson <> '' ORDER BY code LIMIT 1",
  )[0]!.code;
  await signIn(page, "production.tess", `/tanks/${tank}`);
  const form = page.getByRole("form", { name: "Record a gauge reading" });
  const book = await tankStockG(page, tank);
  // A level outside the calibration table is refused on the level field.
  await form.getByLabel("Read as").selectOption("LEVEL");
  await form.getByLabel("Level (mm)").fill("99999");
  await form.getByLabel("Temperature (°C)").fill("20");
  await form.getByRole("button", { name: "Record reading" }).click();
  await expect(form.locator(".field-error")).toContainText("Level must be");
  await expect(form.getByLabel("Level (mm)")).toHaveValue("99999");
  // 1,200 mm is a row of the demo table (10,750 L); the preview says so before saving.
  await form.getByLabel("Level (mm)").fill("1200");
  await expect(form.getByText("1200 mm → 10,750 L by the calibration table")).toBeVisible();
  await form.getByRole("button", { name: "Record reading" }).click();
  await expect(form.getByRole("status")).toContainText("Gauge recorded: 10,750 L");
  await expect(form.getByRole("status")).toContainText(
    `book stock then ${(book / 1000).toLocaleString("en", { maximumFractionDigits: 1 })} kg`,
  );
  const table = page.getByRole("table", { name: "Past gauge readings against the book stock" });
  const first = table.locator("tbody tr").first();
  await expect(first).toContainText("Level 1,200 mm");
  await expect(first).toContainText("10750.0 L");
  const row = readDb<{ massG: number; bookStockG: number }>(
    "SELECT g.massG, g.bookStockG FROM TankGauge g JOIN Tank t ON t.id = g.tankId WHERE t.code = ? ORDER BY g.id DESC LIMIT 1",
    tank,
  )[0]!;
  expect(row.bookStockG).toBe(book);
  const diffKg = Math.abs(row.massG - book) / 1000;
  await expect(first).toContainText(`${diffKg.toFixed(1)} kg`);
  await page.screenshot({ path: "/tmp/tank-moves-gauge.png", fullPage: true });
  expect((await new AxeBuilder({ page }).include("main").analyze()).violations.map((v) => v.id)).toEqual([]);
  await page.goto("/tanks");
  await page.screenshot({ path: "/tmp/tank-moves-list.png", fullPage: true });
});

test("receiving two pickups straight into a tank accepts the lot with a reason and fills the tank", async ({
  page,
  baseURL,
}) => {
  const tag = randomUUID().slice(0, 6).toUpperCase();
  const two = await newPickups(baseURL!, tag, 2, 150);
  await signIn(page, "production.tess", "/receiving");
  await expect(page.getByRole("complementary", { name: "Before unloading and pumping" })).toContainText(
    "hydrogen sulfide",
  );
  await expect(page.getByRole("complementary", { name: "Before unloading and pumping" })).toContainText(
    "Never enter a grease pit, tank or container",
  );
  for (const p of two) await page.getByLabel(`Take pickup ${p}`).check();
  const lotCode = `L-TK-${tag}`;
  await page.getByLabel("Lot number").fill(lotCode);
  await page.getByLabel("Measured volume (L)").fill("290");
  await page.getByLabel("Temperature at measurement (°C)").fill("22");
  const tank = await roomiestTank(page, "Pool into");
  await page.getByLabel("Pool into").selectOption(tank.code);
  await page.getByRole("button", { name: "Receive as one lot" }).click();
  await expect(
    page
      .locator(".field")
      .filter({ has: page.getByLabel("Reason for accepting now (only when pooling into a tank)") })
      .locator(".field-error"),
  ).toContainText("Reason for accepting is required");
  await expect(page.getByLabel(`Take pickup ${two[1]}`)).toBeChecked();
  await expect(page.getByLabel("Pool into")).toHaveValue(tank.code);
  const before = await tankStockG(page, tank.code);
  await page.getByLabel("Reason for accepting now (only when pooling into a tank)").fill("tank sample titrated");
  await page.getByRole("button", { name: "Receive as one lot" }).click();
  await expect(page.locator("p.form-ok")).toContainText(`accepted and moved whole into tank ${tank.code}`);
  await page.screenshot({ path: "/tmp/tank-moves-receiving.png", fullPage: true });
  expect((await new AxeBuilder({ page }).include("main").analyze()).violations.map((v) => v.id)).toEqual([]);
  const lot = readDb<{ massG: number; status: string }>(
    "SELECT massG, status FROM FeedstockLot WHERE code = ?",
    lotCode,
  )[0]!;
  expect(await tankStockG(page, tank.code)).toBe(before + lot.massG);
  expect(lot.status).toBe("CONSUMED");
  const audit = readDb<{ reason: string }>(
    "SELECT reason FROM AuditEvent WHERE entity = 'FeedstockLot' AND entityKey = ? AND action = 'CHANGE'",
    lotCode,
  );
  expect(audit.map((a) => a.reason)).toEqual(["tank sample titrated"]);
  const linked = readDb<{ code: string }>(
    "SELECT p.code FROM Pickup p JOIN FeedstockLot l ON l.id = p.lotId WHERE l.code = ? ORDER BY p.code",
    lotCode,
  );
  expect(linked.map((r) => r.code)).toEqual(two);
});
