import AxeBuilder from "@axe-core/playwright";
import { expect, test } from "./support/test";
import type { Page } from "@playwright/test";
import { signIn } from "./support/sign-in";

// The first signed-in page of a fresh server starts the site's trace index (a whole-ledger replay);
// on a busy machine that can outlast the sign-in check, so one page is loaded first and awaited.
test.beforeAll(async ({ playwright, baseURL }) => {
  const ctx = await playwright.request.newContext({ baseURL });
  expect(
    (await ctx.post("/api/session", { data: { login: "compliance.nell", password: "quillmoor-demo" } })).status(),
  ).toBe(200);
  expect((await ctx.get("/specs", { timeout: 60_000 })).status()).toBe(200);
  await ctx.dispose();
});

// A buyer wants drier fuel than the edition asks for: compliance copies ASTM D6751-23a No. 2-B S15 into
// the site's own specification with a tighter water-and-sediment limit (published: 0.050 % volume max,
// ASTM D6751-23a Table 1), then tightens it again as version 2. Version 1 stays on record.
/** WCAG 2.1 AA as checked by axe-core: no serious or critical violations on the page as it stands. */
async function expectNoSeriousViolations(page: Page): Promise<void> {
  const results = await new AxeBuilder({ page }).analyze();
  expect(
    results.violations
      .filter((v) => v.impact === "serious" || v.impact === "critical")
      .map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`),
  ).toEqual([]);
}

test("compliance copies a built-in grade with a tighter water limit, then makes version 2", async ({ page }) => {
  const name = `Buyer tighter water ${Date.now() % 1_000_000}`;
  await signIn(page, "compliance.nell", "/specs");
  await page.getByLabel("Copy from").selectOption({ label: "ASTM D6751-23a No. 2-B S15" });
  await page.getByRole("button", { name: "Show its limits" }).click();
  const form = page.getByRole("form", { name: "New site specification" });
  await expect(form.getByLabel("Water and sediment, upper limit")).toHaveValue("0.05");
  await expectNoSeriousViolations(page);
  await form.getByLabel("Name", { exact: true }).fill(name);
  // Looser than the edition is refused beside the field, and what was typed stays.
  await form.getByLabel("Water and sediment, upper limit").fill("0.060");
  await form.getByLabel("Reason").fill("Buyer contract, clause 4: water and sediment");
  await form.getByRole("button", { name: "Save as version 1" }).click();
  await expect(form.locator(".field-error")).toContainText("may tighten it, not loosen");
  await expect(form.getByLabel("Name", { exact: true })).toHaveValue(name);
  await form.getByLabel("Water and sediment, upper limit").fill("0.030");
  await form.getByRole("button", { name: "Save as version 1" }).click();
  // Saved: the new version's own page, with the changed limit in bold beside the published one.
  await expect(page.getByRole("status")).toHaveText(`${name} version 1 saved.`);
  await expect(page.getByRole("heading", { level: 1 })).toContainText(name);
  await expect(page.getByRole("row", { name: /Water and sediment/ }).first()).toContainText("≤ 0.030 % volume");
  await page.screenshot({ path: "/tmp/spec-version1.png", fullPage: false });
  await expect(page.getByText("1 (current)")).toBeVisible();
  const next = page.getByRole("form", { name: `New version of ${name}` });
  await expect(next.getByLabel("Water and sediment, upper limit")).toHaveValue("0.03");
  await next.getByLabel("Water and sediment, upper limit").fill("0.025");
  await next.getByLabel("Reason").fill("Buyer tightened the clause for winter deliveries");
  await next.getByRole("button", { name: "Save as version 2" }).click();
  await expect(page.getByRole("status")).toHaveText(`${name} version 2 saved.`);
  await page.screenshot({ path: "/tmp/spec-version.png", fullPage: true });
  await expectNoSeriousViolations(page);

  await expect(page.getByText("2 (current)")).toBeVisible();
  await page.goto("/specs");
  await page.screenshot({ path: "/tmp/specs.png", fullPage: false });
  const rows = page.getByRole("row").filter({ has: page.getByRole("link", { name }) });
  await expect(rows).toHaveCount(2);
  await expect(rows.nth(0)).toContainText("≤ 0.030 % volume");
  await expect(rows.nth(1)).toContainText("2 (current)");
  await expect(rows.nth(1)).toContainText("≤ 0.025 % volume");

  // The confidence mark beside a limit leads to its published source.
  await page
    .getByRole("row", { name: /Acid number/ })
    .first()
    .getByRole("link", { name: "published value" })
    .click();
  await expect(page).toHaveURL(/\/references#astm-d6751-23a-acid-number$/);
  await expect(page.locator("#astm-d6751-23a-acid-number")).toBeVisible();
  await page.screenshot({ path: "/tmp/references.png", fullPage: false });
  await expectNoSeriousViolations(page);
});

test("a production user sees the specifications but cannot write a site specification", async ({ page, baseURL }) => {
  await signIn(page, "production.tess", "/specs");
  await expect(page.getByRole("heading", { name: "Specifications", level: 1 })).toBeVisible();
  await expect(page.getByText("Site specifications are written by compliance staff.")).toBeVisible();
  await expect(page.getByRole("form", { name: "New site specification" })).toHaveCount(0);
  const r = await page.request.post("/api/specs", {
    headers: { "idempotency-key": `spec-${Date.now()}`, origin: baseURL! },
    data: {
      baseKey: "astm-d6751-23a/no-2-b-s15",
      name: "Not allowed",
      limits: { "water-sediment": { min: null, max: 0.03 } },
      reason: "Trying",
    },
  });
  expect(r.status()).toBe(403);
});
