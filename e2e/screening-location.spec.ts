import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// A collector who lets the phone share its distance logs a pickup far from the source's address; only the
// distance band travels with the pickup, and the source check raised on receipt says so in one sentence.

const SOURCE = "R007";
// Our own fictional coordinates: the address, and a phone about 33 km north of it (0.3° of latitude).
const ADDRESS = { latitude: 47.25, longitude: 8.5 };
const PHONE = { latitude: 47.55, longitude: 8.5 };

test("a pickup logged far from the source's address raises a phone-distance flag for compliance", async ({
  page,
  browser,
  baseURL,
}) => {
  test.setTimeout(180_000);

  // Compliance records where the source is.
  await signIn(page, "compliance.nell", `/sources/${SOURCE}`);
  await page.getByText("Change capacity, hours and location").click();
  const profile = page.getByRole("form", { name: "Capacity and hours" });
  await profile.getByLabel("Latitude of the address").fill(String(ADDRESS.latitude));
  await profile.getByLabel("Longitude of the address").fill(String(ADDRESS.longitude));
  await profile.getByRole("button", { name: "Save capacity and hours" }).click();
  await expect(profile.getByRole("status")).toHaveText("Capacity and hours saved.");

  // The collector's phone, with location granted, far from the address.
  const phone = await browser.newContext({
    baseURL,
    viewport: { width: 360, height: 740 },
    isMobile: true,
    hasTouch: true,
    geolocation: PHONE,
    permissions: ["geolocation"],
  });
  const collector = await phone.newPage();
  await signIn(collector, "collector.odo", "/collect");
  const collectPage = await collector.goto("/collect");
  expect(collectPage?.headers()["permissions-policy"]).toContain("geolocation=(self)");
  await expect(collector.locator('.collect-app[data-outbox-ready="1"]')).toBeVisible();
  await collector.getByRole("button", { name: "Share distance" }).click();
  await expect(collector.getByRole("group", { name: "Distance from the stop" })).toHaveCount(0);
  await collector.locator("#field-sourceCode").fill(SOURCE);
  await collector.getByLabel("Containers", { exact: true }).fill("2");
  await collector.getByLabel(/^Volume \(L/).fill("95");
  await collector.getByLabel(/^Oil temperature/).fill("18");
  await collector.getByRole("button", { name: "Save pickup" }).click();
  await expect(collector.locator(".collect-saved")).toContainText("kept on this phone");
  await expect(collector.locator(".collect-count")).toHaveText("All sent", { timeout: 45_000 });
  const code = (await collector.locator(".collect-sent li[data-record-id]").first().innerText()).match(
    /PU-[\w-]+/,
  )?.[0];
  expect(code, "the sent pickup shows its number").toBeTruthy();
  await phone.close();

  // The check that ran when the pickup arrived left a flag naming the pickup and the band, not a position.
  await page.goto("/screening");
  const flag = page
    .locator("tbody tr")
    .filter({ hasText: SOURCE })
    .filter({
      hasText: `When pickup ${code} was logged the collector's phone was more than 10 km from the source's address.`,
    });
  await expect(flag).toHaveCount(1);
  await expect(page.getByText(String(PHONE.latitude))).toHaveCount(0);
});

test("compliance sets the site's own margin around opening hours, with a reason, and sees it in force", async ({
  page,
}) => {
  await signIn(page, "compliance.nell", "/screening");
  await page.getByRole("link", { name: "Thresholds in force and their changes" }).click();
  await expect(page.getByRole("heading", { name: "Source check thresholds", level: 1 })).toBeVisible();
  const form = page.getByRole("form", { name: "Change a threshold" });
  await form.getByLabel("Threshold").selectOption("hoursMargin");
  await form.getByLabel("New value").fill("30");
  await form.getByLabel("Reason").fill("night kitchens at the market hall");
  await form.getByRole("button", { name: "Save the threshold" }).click();
  // Refused, naming the field, with what was typed kept.
  await expect(form.getByText("New value must be between 0 and 12")).toBeVisible();
  await expect(form.getByLabel("Reason")).toHaveValue("night kitchens at the market hall");
  await form.getByLabel("New value").fill("2");
  await form.getByRole("button", { name: "Save the threshold" }).click();
  await expect(form.getByRole("status")).toHaveText("Margin around opening hours is now 2; the next checks use it.");
  const row = page.getByRole("row").filter({ hasText: "Margin around opening hours" }).first();
  await expect(row).toContainText("this site");
  await expect(page.getByRole("row").filter({ hasText: "night kitchens at the market hall" })).toContainText(
    "Margin around opening hours: 2",
  );
});
