import { request as playwrightRequest } from "@playwright/test";
import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// Compliance staff review a month: the statement closes (inputs = outputs + closing stock within the
// tolerance); a closed month refuses new bookings — tried directly through the API as a production
// user; reopening needs a reason, which is recorded and shown; closing again locks it again.

test("a month's balance closes, a closed month refuses bookings, and reopening needs a reason", async ({
  page,
  baseURL,
}) => {
  await signIn(page, "compliance.nell", "/balance?period=MONTH&year=2026&month=10");
  await expect(page.getByRole("heading", { name: /Balance 2026-10/ })).toBeVisible();
  // The statement's own totals: total in equals total out + closing + unaccounted (the identity), and
  // the demo plant's books close (flag says "closes").
  const totalIn = page.getByRole("row", { name: /^Total in/ });
  const totalOut = page.getByRole("row", { name: /^Total out \+ closing \+ unaccounted/ });
  const kgOf = async (row: typeof totalIn) =>
    Number((await row.locator("td").last().innerText()).replace(/[^\d.]/g, ""));
  expect(await kgOf(totalIn)).toBeGreaterThan(0);
  expect(await kgOf(totalOut)).toBe(await kgOf(totalIn));
  await expect(page.getByText(/closes · 0\.000 %/).first()).toBeVisible();

  // The demo plant's October is closed: a booking dated in it is refused on the server, whoever sends it.
  await expect(page.getByText(/Accounting period 2026-10-01 – 2026-10-31: closed/)).toBeVisible();
  const production = await playwrightRequest.newContext({ baseURL });
  expect(
    (
      await production.post("/api/session", { data: { login: "production.tess", password: "quillmoor-demo" } })
    ).status(),
  ).toBe(200);
  const refused = await production.post("/api/transfers", {
    headers: { "idempotency-key": `closed-month-${Date.now()}`, origin: baseURL! },
    data: { fromKind: "TANK", fromCode: "T1", toTankCode: "T2", at: "2026-10-15T10:00:00Z", massKg: 1 },
  });
  expect(refused.status()).toBe(409);
  const body = (await refused.json()) as { issues: Array<{ code: string; message: string }> };
  expect(body.issues[0]?.code).toBe("PERIOD.CLOSED");

  // Reopening without a reason is refused and says so; with a reason it reopens and the reason is shown.
  const reopen = page.getByRole("button", { name: "Reopen 2026-10" });
  await reopen.click();
  await expect(page.getByRole("alert").filter({ hasText: /reason/i })).toBeVisible();
  await page.getByLabel("Reason for reopening 2026-10 (required)").fill("Late delivery note from a hauler to book");
  await reopen.click();
  await expect(page.getByRole("status").filter({ hasText: "reopened" })).toBeVisible();
  await page.reload();
  await expect(page.getByRole("cell", { name: "Late delivery note from a hauler to book" })).toBeVisible();

  // Close it again with a note: locked again, both events listed with who did them.
  await page.getByLabel("Note for closing 2026-10 (optional)").fill("Month-end review done again");
  await page.getByRole("button", { name: "Close 2026-10" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Period closed" })).toBeVisible();
  await page.reload();
  await expect(page.getByRole("cell", { name: "Month-end review done again" })).toBeVisible();
  await expect(page.getByRole("button", { name: "Reopen 2026-10" })).toBeVisible();
  const again = await production.post("/api/transfers", {
    headers: { "idempotency-key": `closed-month-again-${Date.now()}`, origin: baseURL! },
    data: { fromKind: "TANK", fromCode: "T1", toTankCode: "T2", at: "2026-10-20T10:00:00Z", massKg: 1 },
  });
  expect(again.status()).toBe(409);
});

test("the chain-of-custody page shows the active rule set and flags claims over the balance", async ({ page }) => {
  await signIn(page, "compliance.nell", "/balance/custody");
  await expect(page.getByRole("heading", { name: "Chain of custody" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Active rule set" })).toBeVisible();
  // Every certified claim of the demo is checked against the credit at its booking (the demo's claims fit).
  await expect(page.getByText("within balance").first()).toBeVisible();
  // A claim larger than every set's credit is refused before anything is saved, with the shortfall named.
  await page.getByLabel("Try a claim now (kg of ester)").fill("900000");
  await page.getByRole("button", { name: "Show" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "now would be refused" })).toBeVisible();
});

test("waste due lists containers by stream with hauler totals and the rule set's sources", async ({ page }) => {
  await signIn(page, "compliance.nell", "/waste/due");
  await expect(page.getByRole("heading", { name: "Waste due for haul-away" })).toBeVisible();
  await page.getByLabel("Days ahead").fill("400");
  await page.getByRole("button", { name: "List what is due" }).click();
  await expect(page.getByText(/Glycerol phase: \d+ container/)).toBeVisible();
  await expect(page.getByRole("cell", { name: /40 CFR 262\.17/ }).first()).toBeVisible();
  // Bad input: the field is named.
  await page.getByLabel("Days ahead").fill("-3");
  await page.getByRole("button", { name: "List what is due" }).click();
  await expect(page.getByRole("alert").first()).toContainText(/Days ahead/i);
});
