import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// Issue: each record's history is one click from its row. From the lot list, one click shows who
// recorded the lot and when, its values, and that the site's audit chain checks out.
test("a lot's history is one click from its row, with who, when, values and the chain check", async ({ page }) => {
  await signIn(page, "compliance.nell", "/lots");
  const firstRow = page.locator("tbody tr").first();
  const code = (await firstRow.locator("a.code").first().innerText()).trim();
  await firstRow.getByRole("link", { name: `History of lot ${code}` }).click();
  await expect(page.getByRole("heading", { name: `History of feedstock lot ${code}` })).toBeVisible();
  await expect(page.getByRole("status").filter({ hasText: "chain intact" })).toBeVisible();
  const created = page.locator("tbody tr").filter({ hasText: "Recorded lot" }).first();
  await expect(created).toBeVisible();
  await created.locator("summary").click();
  await expect(created.getByRole("row", { name: /^Number/ }).first()).toContainText(code);
  await expect(created).not.toContainText("massG"); // fields read as words, not stored names

  // Periods: a closed month's history names the close and who did it.
  await page.goto("/periods");
  const closedRow = page.locator("tbody tr").filter({ hasText: "Closed" }).first();
  await closedRow.getByRole("link", { name: /^History of accounting period/ }).click();
  await expect(page.locator("tbody tr").filter({ hasText: "Closed" }).first()).toBeVisible();

  // An unknown kind is refused with the field named, not a blank page.
  await page.goto("/history?kind=nonsense&key=X");
  await expect(page.locator("p.form-error[role=alert]")).toContainText("Record kind");
});
