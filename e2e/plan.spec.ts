import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// Planning in the browser: an impossible blend says which limit fails; a possible one proposes draws
// and a recipe card with its cautions; recorded as planned, started and finished, the batch shows its yield.
test("plan a batch, record it, start and finish it, see the yield", async ({ page }) => {
  test.setTimeout(120_000);
  const consoleErrors: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error") consoleErrors.push(m.text());
  });
  const code = `E2E-${Date.now().toString(36).toUpperCase()}`;
  await signIn(page, "production.tess", "/plan");
  await expect(page.getByRole("heading", { level: 1, name: "Plan a batch" })).toBeVisible();
  // The cautions are on the page before any plan is made, not only on the card.
  const cautions = page.getByRole("complementary", { name: "Cautions for the batch" });
  await expect(cautions).toContainText("Methanol is toxic and highly flammable");
  await expect(cautions).toContainText("safety data sheets");

  await page.getByLabel("Oil to charge (kg)").fill("5000");
  await page.getByLabel("Blend FFA limit (%)").fill("0.01");
  await page.getByRole("button", { name: "Propose draws and recipe" }).click();
  await expect(page.getByRole("heading", { name: "No blend meets the limits" })).toBeVisible();
  await expect(page.getByText(/points above the limit 0\.01 %/).first()).toBeVisible();
  await expect(page.getByLabel("Oil to charge (kg)")).toHaveValue("5000");

  await page.getByLabel("Blend FFA limit (%)").fill("");
  // The lab's saponification value goes in as reported; the card shows the molar mass worked out from it.
  await page.getByLabel("Saponification value (mg KOH/g, optional)").fill("190");
  await page.getByRole("button", { name: "Propose draws and recipe" }).click();
  await expect(page.getByRole("heading", { name: "Proposed draws" })).toBeVisible();
  await expect(page.getByRole("columnheader", { name: "FFA as oleic" }).first()).toBeVisible();
  const card = page.getByRole("article", { name: /Recipe card/ });
  await expect(
    card.getByText(/from saponification value 190\.0 mg KOH\/g: 3 × 56\.1 × 1000 ÷ \(190\.0 − \d+\.\d\d acid value\)/),
  ).toBeVisible();
  await expect(card.getByText(/FFA as oleic \(acid value/)).toBeVisible();
  await expect(card.getByText("Methanol to add")).toBeVisible();
  await expect(card.getByText(/Methanol is toxic/)).toBeVisible();
  await expect(card.getByText(/hydroxide are corrosive/)).toBeVisible();
  await expect(card.getByText(/Work to the safety data sheets/)).toBeVisible();

  await page.getByRole("link", { name: "Printable recipe card" }).click();
  await expect(page.getByRole("button", { name: "Print the card" })).toBeVisible();
  await expect(page.getByRole("article", { name: /recipe card/i }).getByText(/Methanol is toxic/)).toBeVisible();
  await page.goBack();

  const record = page.getByRole("form", { name: "Record as planned" });
  await record.getByLabel("Batch number").fill(code);
  await record.getByRole("button", { name: "Record as planned" }).click();
  await expect(page).toHaveURL(new RegExp(`/batches/${code}$`));
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Batch ${code}`);
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Batches", exact: true }).click();
  await expect(page.getByRole("link", { name: code, exact: true })).toBeVisible();
  await page.getByRole("link", { name: code, exact: true }).click();

  await page.getByRole("link", { name: "Record the start (charges)" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Start batch ${code}`);
  await page.getByRole("button", { name: "Record the start" }).click();
  // Once the charges are booked the page turns into the finish form.
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Finish batch ${code}`);

  // Outputs that account for everything charged: plausible ester, wash water and methanol, the glycerol phase takes the rest.
  await page.getByLabel("Output mass in kg, row 1").fill("4800");
  // Wash water drawn off: the planned washing water (filled in from the plan) and what it washed out.
  await page.getByLabel("Output mass in kg, row 3").fill("4700");
  await page.getByLabel("Output mass in kg, row 4").fill("400");
  await page.getByLabel("Output mass in kg, row 5").fill("50");
  await page.getByLabel("Reason for the loss, row 5").fill("spilled at the decanter drain");
  const left = async () => Number((await page.getByTestId("left-to-account").textContent())?.replace(/[^\d.-]/g, ""));
  const rest = await left();
  expect(rest).toBeGreaterThan(0);
  await page.getByLabel("Output mass in kg, row 2").fill(rest.toFixed(3));
  await expect(page.getByTestId("left-to-account")).toHaveText("0.000 kg");
  await page.getByRole("button", { name: "Record the finish" }).click();
  await expect(page).toHaveURL(new RegExp(`/batches/${code}$`));
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Batch ${code}`);
  const yieldSection = page.getByRole("region", { name: "Yield" });
  await expect(yieldSection.getByText("Ester vs theory")).toBeVisible();
  await expect(yieldSection.getByTestId("ester-yield")).toHaveText(/%$/);
  await page.screenshot({ path: "test-results/plan.png", fullPage: true });
  expect(consoleErrors).toEqual([]);
});
