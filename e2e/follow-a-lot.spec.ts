import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// A compliance question answered in the browser: from a collector's pickup, through its lot and
// tank, to the product lots made from it. Uses only what the page shows (roles and names).
test("follow one lot from its pickup to its product lot", async ({ page }) => {
  const consoleErrors: string[] = [];
  const foreignRequests: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error") consoleErrors.push(m.text());
  });
  page.on("request", (r) => {
    const host = new URL(r.url()).hostname;
    if (host !== "127.0.0.1" && host !== "localhost") foreignRequests.push(r.url());
  });

  await page.goto("/");
  await expect(page).toHaveURL(/\/login/);
  await signIn(page, "compliance.nell");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Today");
  await expect(page.getByText("Quillmoor Fuel Works").first()).toBeVisible();

  await page.getByRole("navigation").getByRole("link", { name: "Pickups", exact: true }).click();
  await expect(page.getByRole("heading", { level: 1, name: /Pickups/ })).toBeVisible();
  // An older page of pickups: their oil has long been through the plant.
  await page
    .getByRole("navigation", { name: "Pages" })
    .first()
    .getByRole("link", { name: /^Page \d+$/ })
    .last()
    .click();
  await expect(page).toHaveURL(/page=\d+/);
  await expect(page.getByText(/Page (\d+) of \1 /).first()).toBeVisible();
  const pickupLink = page
    .getByRole("table")
    .getByRole("link", { name: /^PU-\d{5}$/ })
    .first();
  const pickupCode = (await pickupLink.textContent())?.trim() ?? "";
  await pickupLink.click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Pickup ${pickupCode}`);

  const lotLink = page.getByRole("link", { name: /^L-\d{4}$/ }).first();
  const lotCode = (await lotLink.textContent())?.trim() ?? "";
  await lotLink.click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(lotCode);
  // The lot lists the pickup it came from.
  await expect(page.getByRole("link", { name: pickupCode, exact: true })).toBeVisible();

  const wentTo = page.getByRole("region", { name: /Where it went/ });
  await expect(wentTo).toBeVisible();
  const productLink = wentTo.getByRole("link", { name: /^P-\d{4}$/ }).first();
  const productCode = (await productLink.textContent())?.trim() ?? "";
  await productLink.click();
  await expect(page.getByRole("heading", { level: 1 })).toContainText(productCode);
  // Backward from the product lot, the same feedstock lot appears among what it was made of.
  await expect(page.getByRole("link", { name: lotCode, exact: true }).first()).toBeVisible();

  await page.screenshot({ path: "test-results/follow-a-lot.png", fullPage: true });
  expect(consoleErrors).toEqual([]);
  expect(foreignRequests).toEqual([]);
});
