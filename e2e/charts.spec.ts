import { request as playwrightRequest } from "@playwright/test";
import { expect, test } from "./support/test";
import type { Locator, Page } from "@playwright/test";
import { signIn } from "./support/sign-in";

// The pictures: drawn on the server as SVG, so each is checked for what it draws (series and points
// against the numbers table under it), for its sentence of key figures, and for no script-policy
// complaint in the browser. Pictures of fixed demo history (a past month's flows, a supplier's lots)
// are also compared with a committed image; those that run up to today are saved to look at instead.

const SHOTS = "test-results/charts";

function watchPolicy(page: Page): string[] {
  const complaints: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to/i.test(m.text())) complaints.push(m.text());
  });
  return complaints;
}

/** Signs in, then opens the page: a page drawing a picture may take longer than the sign-in waits for on a cold server. */
async function open(page: Page, login: string, path: string): Promise<void> {
  await signIn(page, login, "/me");
  await page.goto(path);
}

const picture = (page: Page, id: string): Locator => page.locator(`figure[data-picture="${id}"]`);
// The library marks each drawn element with its series; a reference line (fill none) is not a data point.
const drawn = (fig: Locator, series: number): Locator =>
  fig.locator(`svg path[ecmeta_ssr_type="chart"][ecmeta_series_index="${series}"]:not([fill="none"])`);

async function numbersTable(fig: Locator, caption: string): Promise<Locator> {
  await fig.getByText("The numbers behind this picture").click();
  return fig.locator("table").filter({ has: fig.page().locator("caption", { hasText: caption }) });
}

test("a tank's stock over time: book line, gauge points and capacity, with its numbers", async ({ page }) => {
  const complaints = watchPolicy(page);
  await open(page, "production.tess", "/tanks/T1");
  const fig = picture(page, "tank-stock");
  await expect(fig.getByRole("heading", { name: "Stock over time" })).toBeVisible();
  const img = fig.getByRole("img", {
    name: /Tank T1: book stock .* kg now, highest .* kg against a capacity of about .* kg/,
  });
  await expect(img).toBeVisible();
  for (const name of ["Book stock", "Gauge readings", "Capacity"])
    await expect(fig.locator("svg text", { hasText: name })).toHaveCount(1);
  const gauges = await numbersTable(fig, "Gauge readings");
  // One point per gauge reading in the table.
  await expect(drawn(fig, 1)).toHaveCount(await gauges.locator("tbody tr").count());
  const bookings = await numbersTable(fig, "Book stock after each booking");
  expect(await bookings.locator("tbody tr").count()).toBeGreaterThan(10);
  await img.screenshot({ path: `${SHOTS}/tank-stock.png` });
  await page.setViewportSize({ width: 360, height: 800 });
  await fig.scrollIntoViewIfNeeded();
  await page.screenshot({ path: `${SHOTS}/tank-stock-360.png` });
  expect(complaints).toEqual([]);
});

test("a new tank with no movements says so instead of drawing", async ({ page, baseURL }) => {
  const production = await playwrightRequest.newContext({ baseURL });
  expect(
    (
      await production.post("/api/session", { data: { login: "production.tess", password: "quillmoor-demo" } })
    ).status(),
  ).toBe(200);
  const code = `TC-${Date.now() % 100_000}`;
  const made = await production.post("/api/tanks", {
    headers: { "idempotency-key": `chart-tank-${code}`, origin: baseURL! },
    data: { code, name: "Spare settling tank", service: "FEEDSTOCK", capacityL: 5000 },
  });
  expect(made.status(), await made.text()).toBe(200);
  await open(page, "production.tess", `/tanks/${code}`);
  await expect(picture(page, "tank-stock").getByText(/Nothing has been moved into or out of this tank/)).toBeVisible();
});

test("feedstock received per week, stacked by material, on the lots page", async ({ page }) => {
  const complaints = watchPolicy(page);
  await open(page, "production.tess", "/lots");
  const fig = picture(page, "receipts-per-week");
  const img = fig.getByRole("img", {
    name: /kg of feedstock received in the 12 weeks from \d{4}-\d{2}-\d{2}, \d+ % of it .*; the most in the week of/,
  });
  await expect(img).toBeVisible();
  const table = await numbersTable(fig, "Feedstock received per week, by material");
  await expect(table.locator("tbody tr")).toHaveCount(12);
  // One legend entry and one stack layer per material column (the table adds "Week of" and "All kinds").
  const materials = (await table.locator("thead th").count()) - 2;
  expect(materials).toBeGreaterThan(1);
  for (let i = 0; i < materials; i++) {
    const name = (
      await table
        .locator("thead th")
        .nth(i + 1)
        .innerText()
    ).replace(/\s*\(kg\)$/, "");
    await expect(fig.locator("svg text", { hasText: name })).toHaveCount(1);
    await expect(drawn(fig, i)).toHaveCount(12);
  }
  // The stacked total of the weeks is the table's total.
  const weekTotals = await table.locator("tbody tr td:last-child").allInnerTexts();
  const sum = weekTotals.reduce((s, t) => s + Number(t.replace(/,/g, "")), 0);
  const total = Number((await table.locator("tfoot td").last().innerText()).replace(/,/g, ""));
  expect(sum).toBeCloseTo(total, 2);
  await img.screenshot({ path: `${SHOTS}/receipts-per-week.png` });
  expect(complaints).toEqual([]);
});

test("FFA of a supplier's lots over time on its source page", async ({ page }) => {
  const complaints = watchPolicy(page);
  await open(page, "compliance.nell", "/sources/D001");
  const fig = picture(page, "source-ffa");
  const img = fig.getByRole("img", {
    name: /\d+ lots with material from source D001 titrated: FFA from [\d.]+ % to [\d.]+ %, [\d.]+ % weighted by mass/,
  });
  await expect(img).toBeVisible();
  const table = await numbersTable(fig, "Lots with material from this source");
  const rows = await table.locator("tbody tr").count();
  expect(rows).toBeGreaterThan(2);
  const series = (await table.locator("tbody td:nth-child(3)").allInnerTexts()).filter(
    (m, i, all) => all.indexOf(m) === i,
  ).length;
  let points = 0;
  for (let i = 0; i < series; i++) points += await drawn(fig, i).count();
  expect(points).toBe(rows);
  // Its time axis runs up to today, so it is saved to look at rather than compared with a fixed image.
  await img.screenshot({ path: `${SHOTS}/source-ffa.png` });
  expect(complaints).toEqual([]);
});

test("a collector's view of a source has no lab picture", async ({ page }) => {
  await open(page, "collector.ivo", "/sources/R001");
  await expect(page.getByRole("heading", { name: /Source R001/ })).toBeVisible();
  await expect(picture(page, "source-ffa")).toHaveCount(0);
});

test("the period's flows as a Sankey picture on the balance page, and an empty period says so", async ({ page }) => {
  const complaints = watchPolicy(page);
  await open(page, "compliance.nell", "/balance?period=MONTH&year=2026&month=10");
  const fig = picture(page, "period-flows");
  const img = fig.getByRole("img", {
    name: /In 2026-10, .* kg came in from \d+ origins .*charged to batches.* was shipped and .* hauled away as waste\./,
  });
  await expect(img).toBeVisible();
  const table = await numbersTable(fig, "Flows drawn, from each step to the next");
  const ends = new Set<string>();
  for (const row of await table.locator("tbody tr").all()) {
    const cells = await row.locator("td").allInnerTexts();
    ends.add(cells[0] ?? "");
    ends.add(cells[1] ?? "");
  }
  // One labelled node per place named in the table; small sources are pooled.
  await expect(fig.locator("svg text")).toHaveCount(ends.size);
  expect([...ends].some((e) => /^Other sources \(\d+\)$/.test(e))).toBe(true);
  expect(ends).toContain("Batches");
  expect(ends).toContain("Shipped");
  await expect(fig.locator("svg")).toHaveScreenshot("period-flows-2026-10.png", { maxDiffPixelRatio: 0.01 });
  await img.screenshot({ path: `${SHOTS}/period-flows.png` });

  await page.goto("/balance?period=MONTH&year=2026&month=4");
  await expect(
    picture(page, "period-flows").getByText("Nothing was moved in this period, so there are no flows to draw."),
  ).toBeVisible();
  expect(complaints).toEqual([]);
});
