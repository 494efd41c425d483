import type { Page } from "@playwright/test";
import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// The site's own limits: compliance changes the closure tolerance with a reason and the month's balance
// is flagged against it at once; compliance sets the water limits and production planning a batch sees
// the site's limit for the base-catalysed step. Bad input names the field and keeps what was typed.
// The journey puts the defaults back at the end (a new version with its reason), so later journeys
// start from the demo plant's limits.

async function closureChip(page: Page): Promise<{ word: string; pct: number }> {
  await page.goto("/balance");
  const text = (await page.getByTestId("measured-closure").textContent()) ?? "";
  const m = /^(closes|warn|fails) · (-?[\d.,]+) %$/.exec(text.trim());
  expect(m, `closure chip reads "${text}"`).not.toBeNull();
  return { word: m![1]!, pct: Math.abs(Number(m![2]!.replace(",", ""))) };
}

async function saveClosure(page: Page, warn: string, fail: string, reason: string): Promise<void> {
  await page.goto("/limits");
  const form = page.getByRole("form", { name: "Change the closure tolerance" });
  await form.getByLabel("Warn above").fill(warn);
  await form.getByLabel("Fail above").fill(fail);
  await form.getByLabel("Reason").fill(reason);
  await form.getByRole("button", { name: "Save the closure tolerance" }).click();
  await expect(form.getByRole("status")).toContainText("Closure tolerance saved");
}

test("compliance tightens the closure tolerance and the month is flagged against it; planning shows the site's water limit", async ({
  browser,
  baseURL,
}) => {
  test.setTimeout(150_000);
  const nell = await (await browser.newContext({ baseURL })).newPage();
  const tess = await (await browser.newContext({ baseURL })).newPage();
  await signIn(nell, "compliance.nell", "/limits");

  // What the month shows under the demo plant's tolerance.
  const before = await closureChip(nell);

  // The limits page: each default with its source and reliance.
  await nell.goto("/limits");
  await expect(nell.getByRole("heading", { level: 1 })).toHaveText("Site limits");
  await expect(nell.getByTestId("in-force-warnPct")).toHaveText("0.5 % of inputs");
  await expect(nell.getByRole("link", { name: "common practice" }).first()).toBeVisible();

  // Bad input: the field is named and the typed value stays.
  const form = nell.getByRole("form", { name: "Change the closure tolerance" });
  await form.getByLabel("Warn above").fill("half a percent");
  await form.getByLabel("Reason").fill("auditor's letter of this month");
  await form.getByRole("button", { name: "Save the closure tolerance" }).click();
  await expect(form.locator(".field-error").first()).toContainText("Warn above must be a number");
  await expect(form.getByLabel("Warn above")).toHaveValue("half a percent");
  await expect(form.getByLabel("Reason")).toHaveValue("auditor's letter of this month");

  // A warn level that moves the month's flag: below its closure when it closes, above it when it warns.
  const closes = before.word === "closes";
  const warn = closes ? Math.max(0.01, Math.floor((before.pct / 2) * 100) / 100) : Math.ceil(before.pct * 150) / 100;
  const fail = closes ? 2 : Math.max(2, Math.ceil(warn * 3));
  await saveClosure(nell, String(warn), String(fail), "auditor's letter of this month asks for a tighter closure");
  await expect(nell.getByTestId("in-force-warnPct")).toHaveText(`${warn} % of inputs`);
  await expect(
    nell.getByText(/by .*: auditor's letter of this month asks for a tighter closure/).first(),
  ).toBeVisible();
  const after = await closureChip(nell);
  expect(after.word).toBe(closes ? "warn" : "closes");
  await expect(nell.getByText(`warn above ${warn.toFixed(2)} %`, { exact: false })).toBeVisible();
  await nell.screenshot({ path: "test-results/site-limits-balance.png", fullPage: true });

  // Water limits: compliance sets the base-catalysed step; production sees it when planning.
  await nell.goto("/limits");
  const water = nell.getByRole("form", { name: "Change the water limits" });
  await water.getByLabel("Water limit for the base-catalysed step").fill("0.05");
  await water.getByLabel("Water limit for the acid step").fill("0.4");
  await water.getByLabel("Reason").fill("our catalyst supplier advises drier oil");
  await water.getByRole("button", { name: "Save the water limits" }).click();
  await expect(water.getByRole("status")).toContainText("Water limits saved");
  await signIn(tess, "production.tess", "/plan");
  await tess.goto("/plan");
  await expect(tess.getByTestId("water-limit-base")).toHaveText("0.05 %");
  await expect(tess.getByTestId("water-limit-acid")).toHaveText("0.4 %");
  await expect(tess.getByText(/our catalyst supplier advises drier oil/).first()).toBeVisible();
  await expect(tess.getByRole("link", { name: "the site's own choice" }).first()).toBeVisible();
  await tess.screenshot({ path: "test-results/site-limits-plan.png", fullPage: true });

  // Production reads the limits but cannot change them.
  await tess.goto("/limits");
  await expect(tess.getByRole("form", { name: "Change the closure tolerance" })).toHaveCount(0);
  await expect(tess.getByRole("heading", { name: "Changes" })).toBeVisible();

  // Back to the demo plant's limits, as a version of its own.
  await saveClosure(nell, "0.5", "2", "journey done: back to the demo plant's tolerance");
  await nell.goto("/limits");
  await water.getByLabel("Water limit for the base-catalysed step").fill("0.06");
  await water.getByLabel("Water limit for the acid step").fill("0.5");
  await water.getByLabel("Reason").fill("journey done: back to the demo plant's water limits");
  await water.getByRole("button", { name: "Save the water limits" }).click();
  await expect(water.getByRole("status")).toContainText("Water limits saved");
});
