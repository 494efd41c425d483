import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// A mistake is corrected, never deleted: a transfer booked into the wrong tank is reversed with a
// reason (the original stays in the ledger, linked), and a titration entered wrongly is voided.
test("reverse a mistaken transfer and void a mistaken titration, each with a reason", async ({ page, baseURL }) => {
  await signIn(page, "production.tess", "/ledger");
  // Book the mistake through the API, as a client would: 1 kg from T1 into T2, now.
  const booked = await page.request.post("/api/transfers", {
    headers: { "idempotency-key": `mistake-${Date.now()}`, origin: baseURL! },
    data: { fromKind: "TANK", fromCode: "T1", toTankCode: "T2", at: new Date().toISOString(), massKg: 1 },
  });
  expect(booked.status()).toBe(200);
  const no = String(((await booked.json()) as { value: { movementId: number } }).value.movementId);
  const t1Before = ((await (await page.request.get("/api/holders/TANK/T1")).json()) as { value: { stockG: number } })
    .value.stockG;

  // Other journeys may have booked later-dated movements (a phone clock ahead), so find the row by its number.
  await page.reload();
  const row = page
    .locator("tbody tr")
    .filter({ has: page.locator("td:first-child", { hasText: new RegExp(`^${no}$`) }) });
  await row.getByText(`Reverse No. ${no}`).click();
  await row.getByRole("button", { name: "Book the reversal" }).click();
  await expect(row.locator(".field-error")).toContainText("Reason");
  await row.getByLabel("What was wrong").fill("Meant for T3, not T2");
  await row.getByRole("button", { name: "Book the reversal" }).click();
  // The page refreshes: the original row now says which movement reversed it, and offers no second reversal.
  await expect(row.getByText(/reversed by No\. \d+/)).toBeVisible();
  await expect(row.getByText(`Reverse No. ${no}`)).toHaveCount(0);
  const t1After = ((await (await page.request.get("/api/holders/TANK/T1")).json()) as { value: { stockG: number } })
    .value.stockG;
  expect(t1After - t1Before).toBe(1000);
  await expect(page.getByText(`reverses No. ${no}`)).toBeVisible();

  // Void a titration on a lot's lab page: it no longer counts and the history keeps why.
  await page.goto("/lab");
  const lotLink = page
    .getByRole("table")
    .getByRole("link", { name: /^L-\d{4}$/ })
    .first();
  const lotCode = (await lotLink.innerText()).trim();
  const saved = await page.request.post("/api/lab/titrations", {
    headers: { "idempotency-key": `titration-${Date.now()}`, origin: baseURL! },
    data: {
      lotCode,
      testedAt: new Date().toISOString(),
      sampleMassG: 7.05,
      titrant: "NAOH",
      concentrationMolL: 0.25,
      titreMl: 9.99,
      basis: "OLEIC",
    },
  });
  expect(saved.status()).toBe(200);
  await page.goto(`/lab/${lotCode}`);
  // 9.99 × 0.25 × 28.2 / 7.05 = 9.99 % FFA (AOCS Ca 5a-40, hand arithmetic)
  const titrationRow = page.locator("tbody tr").filter({ hasText: "9.99 %" }).first();
  await titrationRow.getByText("Void", { exact: true }).click();
  await titrationRow.getByLabel("What was wrong").fill("Sample mass mistyped");
  await titrationRow.getByRole("button", { name: "Void this result" }).click();
  // The voided result leaves the table at once and the page says it is kept on record.
  await expect(page.locator("tbody tr").filter({ hasText: "9.99 %" })).toHaveCount(0);
  await expect(page.getByText(/voided result\(s\) are kept on record/)).toBeVisible();
  await page.getByRole("link", { name: "see the lot's history" }).click();
  await expect(page.getByRole("cell", { name: "Sample mass mistyped" })).toBeVisible();
});

// A charge typed wrong at the start of a batch is taken back on the batch page while it reacts.
test("take back a mistaken charge on a reacting batch, with a reason and the reactor cautions shown", async ({
  page,
  baseURL,
}) => {
  await signIn(page, "production.tess", "/batches");
  const code = `TB-${Date.now() % 1_000_000}`;
  const post = (path: string, data: unknown) =>
    page.request.post(path, { headers: { "idempotency-key": `${code}-${path}`, origin: baseURL! }, data });
  const now = Date.now();
  expect(
    (
      await post("/api/batches/plan", {
        code,
        plannedAt: new Date(now - 60_000).toISOString(),
        targetOilKg: 2,
        catalyst: "KOH",
      })
    ).status(),
  ).toBe(200);
  const started = await post("/api/batches/start", {
    batchCode: code,
    startedAt: new Date(now).toISOString(),
    charges: [
      { fromKind: "TANK", fromCode: "T1", role: "OIL", massKg: 2 },
      { fromKind: "TANK", fromCode: "M1", role: "METHANOL", massKg: 4 },
    ],
  });
  expect(started.status()).toBe(200);
  const m1Before = ((await (await page.request.get("/api/holders/TANK/M1")).json()) as { value: { stockG: number } })
    .value.stockG;

  await page.goto(`/batches/${code}`);
  await expect(page.getByText(/methanol and methoxide are toxic and flammable/)).toBeVisible();
  const charges = page.locator("section, main").getByRole("table").first();
  const methanol = charges.locator("tbody tr").filter({ hasText: "Methanol" });
  await methanol.getByText(/^Take back No\. \d+$/).click();
  await methanol.getByRole("button", { name: "Take this charge back" }).click();
  await expect(methanol.locator(".field-error")).toContainText("Reason");
  await methanol.getByLabel("What was wrong").fill("4 kg typed; 0.4 kg went in");
  await methanol.getByRole("button", { name: "Take this charge back" }).click();
  await expect(page.getByRole("heading", { name: "Charges taken back" })).toBeVisible();
  await page.reload();
  await expect(page.getByRole("heading", { name: "Charges taken back" })).toBeVisible();
  await expect(
    page
      .locator("table")
      .filter({ has: page.getByText("Booked by mistake and reversed") })
      .getByText(/reversed by #\d+/),
  ).toBeVisible();
  const m1After = ((await (await page.request.get("/api/holders/TANK/M1")).json()) as { value: { stockG: number } })
    .value.stockG;
  expect(m1After - m1Before).toBe(4000);
});
