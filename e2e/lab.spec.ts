import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// The lab bench in the browser: a lot waiting for the lab, a titration whose FFA is shown as it is
// typed, a refusal that keeps what was typed, then a good titration, a water result and the decision.
test("titrate a waiting lot, see FFA as you type, and accept it", async ({ page }) => {
  const consoleErrors: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error") consoleErrors.push(m.text());
  });
  await signIn(page, "production.tess", "/lab");
  await expect(page.getByRole("heading", { level: 1, name: "Lab" })).toBeVisible();

  // Whichever lot is still waiting: the demo database has a few, and this test decides one.
  const lotLink = page
    .getByRole("table")
    .getByRole("link", { name: /^L-\d{4}$/ })
    .first();
  const lotCode = (await lotLink.textContent())?.trim() ?? "";
  await lotLink.click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Lab results for lot ${lotCode}`);
  // The titration's solvent is an alcohol with a hydroxide titrant (AOCS Ca 5a-40), not "lye solutions".
  await expect(page.getByRole("complementary", { name: "Cautions" }).first()).toContainText("isopropanol");
  await expect(page.getByRole("complementary", { name: "Cautions" }).first()).toContainText("safety data sheets");

  const form = page.getByRole("form", { name: "Record a titration" });
  await form.getByLabel("Sample mass (g)").fill("7.05");
  await form.getByLabel("Titrant concentration (mol/L)").fill("0.25");
  await form.getByLabel("Titre (mL)").fill("5");
  // AOCS Ca 5a-40: 5.00 mL × 0.25 N × 28.2 / 7.05 g = 5.000 % FFA (AOCS Ca 5a-40, computed)
  await expect(form.getByTestId("live-ffa")).toHaveText("5.00 %");
  // EN 14104: 56.1 × 5.00 × 0.25 / 7.05 = 9.947 mg KOH/g (hand arithmetic)
  await expect(form.getByTestId("live-av")).toHaveText("9.95 mg KOH/g");
  // The arithmetic is on the screen before saving, with the analyst's own readings.
  const working = form.getByTestId("titration-working");
  await expect(working).toContainText("5.00 mL × 0.2500 mol/L × 56.1 ÷ 7.050 g = 9.95 mg KOH/g");
  await expect(working).toContainText("× 28.2 ÷ 7.050 g = 5.00 %");
  // From the acid value by molar mass: 9.9468 × 282.468 / 561.053 = 5.008 % as oleic (IUPAC 2021 molar masses)
  await expect(working).toContainText("= 5.01 % as oleic");
  await form.getByLabel("Titre (mL)").fill("5.2");
  // 5.20 × 0.25 × 28.2 / 7.05 = 5.200 % (hand arithmetic, Ca 5a-40)
  await expect(form.getByTestId("live-ffa")).toHaveText("5.20 %");

  // A blank larger than the titre is refused by the server next to the blank, and nothing typed is lost.
  await form.getByLabel("Blank (mL)").fill("6");
  await form.getByRole("button", { name: "Save titration" }).click();
  await expect(form.getByText("blank (mL) must not exceed the titre (mL)")).toBeVisible();
  await expect(form.getByLabel("Blank (mL)")).toHaveAttribute("aria-invalid", "true");
  await expect(form.getByLabel("Sample mass (g)")).toHaveValue("7.05");
  await expect(form.getByLabel("Titrant concentration (mol/L)")).toHaveValue("0.25");
  await expect(form.getByLabel("Titre (mL)")).toHaveValue("5.2");
  await expect(form.getByLabel("Blank (mL)")).toHaveValue("6");

  await form.getByLabel("Blank (mL)").fill("0");
  await form.getByRole("button", { name: "Save titration" }).click();
  await expect(form.getByRole("status")).toContainText("Titration saved: FFA 5.20 %");
  await expect(page.getByRole("table").first().getByRole("cell", { name: "5.20 %" })).toBeVisible();
  // The lot's FFA names its basis and acid value: EN 14104, 56.1 × 5.20 × 0.25 / 7.05 = 10.34 mg KOH/g (hand arithmetic)
  await expect(page.getByText(/% as oleic \(acid value \d+\.\d\d mg KOH\/g\)/)).toBeVisible();

  const tests = page.getByRole("form", { name: "Record a test result" });
  await tests.getByLabel("Result (% by mass)").fill("0.15");
  await tests.getByRole("button", { name: "Save result" }).click();
  await expect(tests.getByRole("status")).toContainText("Result saved");

  await page.getByRole("button", { name: "Accept lot" }).click();
  // The decision replaces the buttons with the lot's new status.
  await expect(page.getByText(/^This lot is/)).toContainText("Accepted");
  await expect(page.getByRole("button", { name: "Accept lot" })).toHaveCount(0);
  await page.goto(`/lots/${lotCode}`);
  await expect(page.getByText("Accepted", { exact: true }).first()).toBeVisible();
  await page.screenshot({ path: "test-results/lab.png", fullPage: true });
  expect(consoleErrors).toEqual([]);
});
