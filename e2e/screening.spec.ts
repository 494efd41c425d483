import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// Compliance checks a source's plausibility: declares what a kitchen can give, checks the period, then
// confirms one flag (source on watch, its lots on site held, its certified credit withheld) and dismisses
// another with a reason; both decisions show on the source's page and the custody balance withholds its credit.

const SOURCE = "R013"; // a daily, certified restaurant of the demo

test("compliance confirms one source flag and dismisses another, and sees both on the source's page", async ({
  page,
}) => {
  test.setTimeout(180_000);
  await signIn(page, "compliance.nell", `/sources/${SOURCE}`);

  // What the source can give: a declared 10 L a month, far below what is collected there.
  await page.getByText("Change capacity, hours and location").click();
  const profile = page.getByRole("form", { name: "Capacity and hours" });
  await profile.getByLabel("Capacity declared as").selectOption("MONTHLY");
  await profile.getByLabel("Declared volume").fill("10");
  await profile.getByLabel("Declared on").fill("2026-06-01");
  await profile.getByLabel("Declared by").fill("kitchen manager, by telephone");
  await profile.getByRole("button", { name: "Save capacity and hours" }).click();
  await expect(profile.getByRole("status")).toHaveText("Capacity and hours saved.");

  // The queue: check the demo's whole period.
  await page.goto("/screening");
  await expect(page.getByRole("heading", { name: "Source checks", level: 1 })).toBeVisible();
  const run = page.getByRole("form", { name: "Check a period" });
  await run.getByLabel("From").fill("2026-01-01");
  await run.getByLabel("To").fill("2027-01-01");
  await run.getByRole("button", { name: "Check all sources" }).click();
  await expect(run.getByRole("status")).toContainText(
    /Checked \d+ sources, \d+ pickups and \d+ lots: [1-9]\d* new flags\./,
    { timeout: 60_000 },
  );

  const rows = page
    .locator("tbody tr")
    .filter({ hasText: SOURCE })
    .filter({ hasText: "against a declared 10 L/month" });
  await expect(rows.nth(1)).toBeVisible();
  const idOf = async (i: number) =>
    Number(/Decide on flag (\d+)/.exec(await rows.nth(i).locator("summary").innerText())?.[1]);
  const confirmId = await idOf(0);
  const dismissId = await idOf(1);
  const dismissedText = (await rows.nth(1).locator("td").nth(3).innerText()).trim();
  expect(dismissedText).toMatch(
    /^[\d,]+ L in \w+ 2026 against a declared 10 L\/month: [\d,.]+× \(flagged above 1\.5×\)\.$/,
  );

  // Confirm the first: watch, hold its lots, withhold its certified credit.
  await page.getByText(`Decide on flag ${confirmId}`).click();
  const confirm = page.getByRole("form", { name: `Confirm flag ${confirmId}` });
  await confirm.getByLabel("Hold its lots still on site").check();
  await confirm.getByLabel("Withhold its certified credit until cleared").check();
  await confirm.getByLabel("Note").fill("collected volume is beyond the declared kitchen");
  await confirm.getByRole("button", { name: "Confirm flag" }).click();
  // Decided, the flag leaves the review list for the decided list, with the lots it put on hold.
  const confirmedRow = page
    .locator("tbody tr")
    .filter({ hasText: "Confirmed" })
    .filter({ hasText: "collected volume is beyond the declared kitchen" });
  await expect(confirmedRow).toContainText(/lots held: L-\d{4}/);
  const heldLot = /lots held: (L-\d{4})/.exec(await confirmedRow.innerText())?.[1] ?? "";

  // Dismiss the second: a reason is required.
  await page.goto("/screening");
  await page.getByText(`Decide on flag ${dismissId}`).click();
  const dismiss = page.getByRole("form", { name: `Dismiss flag ${dismissId}` });
  await dismiss.getByRole("button", { name: "Dismiss flag" }).click();
  await expect(dismiss.getByText("Reason: say why the flag is dismissed")).toBeVisible();
  await dismiss.getByLabel("Why it is dismissed").fill("holiday market month, agreed at the visit");
  await dismiss.getByRole("button", { name: "Dismiss flag" }).click();
  await expect(
    page
      .locator("tbody tr")
      .filter({ hasText: "Dismissed" })
      .filter({ hasText: "holiday market month, agreed at the visit" }),
  ).toBeVisible();

  // The source's page: standing and both decisions.
  await page.goto(`/sources/${SOURCE}`);
  await expect(page.getByText("On watch", { exact: true })).toBeVisible();
  await expect(page.getByText("Certified credit withheld", { exact: true })).toBeVisible();
  const decided = page.locator("tbody tr");
  await expect(
    decided.filter({ hasText: "Confirmed" }).filter({ hasText: "collected volume is beyond the declared kitchen" }),
  ).toContainText(`lots held: ${heldLot}`);
  await expect(
    decided.filter({ hasText: "Dismissed" }).filter({ hasText: "holiday market month, agreed at the visit" }),
  ).toContainText(dismissedText);

  // The held lot waits for compliance; the custody balance withholds the source's credit.
  await page.goto(`/lots/${heldLot}`);
  await expect(page.getByText("Awaiting lab").first()).toBeVisible();
  await page.goto("/balance/custody");
  await expect(page.getByText(/Withheld after confirmed screening flags: [\d,.]+ kg from .*R013/)).toBeVisible({
    timeout: 60_000,
  });
});
