import { expect, test } from "./support/test";
import type { Page } from "@playwright/test";
import { signIn } from "./support/sign-in";

// Every page a collector uses, on a 360 px phone: nothing runs off the side, and the user's name does
// not sit on top of the product name in the header. Screenshots land in the test's output folder.
test.use({ viewport: { width: 360, height: 740 }, isMobile: true, hasTouch: true });

async function checkPhonePage(page: Page, name: string, path: string): Promise<void> {
  await page.goto(path);
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  const widths = await page.evaluate(() => ({
    scroll: document.scrollingElement?.scrollWidth ?? 0,
    client: document.documentElement.clientWidth,
  }));
  expect(widths.scroll, `${name}: the page is wider than the phone`).toBeLessThanOrEqual(360);
  const product = await page.locator(".site-header .brand-name").boundingBox();
  const user = await page.locator(".site-header .who-link").boundingBox();
  expect(product, `${name}: product name shown`).not.toBeNull();
  expect(user, `${name}: user name shown`).not.toBeNull();
  if (product && user) {
    const overlap =
      product.x < user.x + user.width &&
      user.x < product.x + product.width &&
      product.y < user.y + user.height &&
      user.y < product.y + product.height;
    expect(overlap, `${name}: the user name overlaps the product name`).toBe(false);
    expect(user.x + user.width, `${name}: the user name runs off the screen`).toBeLessThanOrEqual(360);
  }
  await page.screenshot({ path: test.info().outputPath(`${name}.png`), fullPage: true });
}

test("a collector's pages read on a 360 px phone", async ({ page }) => {
  await signIn(page, "collector.mira", "/collect");
  await checkPhonePage(page, "collect", "/collect");
  await checkPhonePage(page, "pickups", "/pickups");
  // The list reads as cards: the column headings are not shown, each value carries its label.
  const firstCard = page
    .getByRole("row")
    .filter({ has: page.getByRole("link", { name: /^PU-/ }) })
    .first();
  if (await firstCard.count()) {
    await expect(page.locator("table.phone-cards thead")).toHaveCSS("position", "absolute");
    const link = firstCard.getByRole("link", { name: /^PU-/ });
    const code = (await link.textContent())?.trim() ?? "";
    await checkPhonePage(page, "pickup", `/pickups/${encodeURIComponent(code)}`);
  }
  await checkPhonePage(page, "sources", "/sources");
  const source = page
    .getByRole("main")
    .getByRole("link", { name: /^[A-Z]\d{3}$/ })
    .first();
  if (await source.count()) await checkPhonePage(page, "source", (await source.getAttribute("href")) ?? "/sources");
  await checkPhonePage(page, "labels", "/labels");
  await checkPhonePage(page, "scan", "/labels/scan");
  await checkPhonePage(page, "me", "/me");
});

test("on the phone, tapping a stop brings the pickup form into view", async ({ page }) => {
  await signIn(page, "collector.mira", "/collect");
  await page.goto("/collect");
  await expect(page.locator(".collect-app[data-outbox-ready='1']")).toBeVisible();
  const stops = page.locator(".collect-stop");
  test.skip((await stops.count()) === 0, "no stop is due today in the demo plant");
  await stops.first().click();
  await expect(page.getByRole("heading", { name: "New pickup" })).toBeInViewport();
  await expect(page.locator("#field-sourceCode")).not.toHaveValue("");
});
