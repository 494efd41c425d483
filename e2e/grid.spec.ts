import { readFileSync } from "node:fs";
import Database from "better-sqlite3";
import type { Locator, Page } from "@playwright/test";
import { plantDatabase } from "./support/plant";
import { expect, test } from "./support/test";
import AxeBuilder from "@axe-core/playwright";
import { signIn } from "./support/sign-in";

// Spreadsheet-style editing journeys on the grid page (issue 5). Each test makes the records it checks,
// with codes unique to the run, so tests do not depend on one another.
const run = Date.now().toString(36).toUpperCase().slice(-5);
/** A day before today (YYYY-MM-DD): the grid refuses pickups observed in the future. */
const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString().slice(0, 10);
/** A minute ago (YYYY-MM-DD HH:MM, UTC as the demo site), so the row sorts first among stored pickups. */
const minuteAgo = () => new Date(Date.now() - 60_000).toISOString().slice(0, 16).replace("T", " ");
const drafts = (page: Page) => page.getByTestId("draft-grid");
const stored = (page: Page) => page.getByTestId("stored-grid");
const status = (page: Page) => page.getByTestId("grid-status");
const cell = (grid: Locator, row: number, col: string) =>
  grid.locator(`.ag-row:not(.ag-row-pinned)[row-index="${row}"] [col-id="${col}"]`);

async function typeInto(page: Page, row: number, col: string, text: string): Promise<void> {
  const c = cell(drafts(page), row, col);
  await c.scrollIntoViewIfNeeded();
  await c.click();
  await page.keyboard.press("F2");
  await page.keyboard.press("ControlOrMeta+a");
  await page.keyboard.type(text);
  await page.keyboard.press("Enter");
  await expect(c).toHaveText(text === "" ? "" : new RegExp(text.replace(/[.*+?^${}()|[\]\\]/g, "\\$&").slice(0, 6)));
}

async function pasteAt(page: Page, row: number, col: string, text: string): Promise<void> {
  await cell(drafts(page), row, col).click();
  await page.evaluate((t) => {
    const dt = new DataTransfer();
    dt.setData("text/plain", t);
    (document.activeElement ?? document.body).dispatchEvent(
      new ClipboardEvent("paste", { clipboardData: dt, bubbles: true, cancelable: true }),
    );
  }, text);
}

async function aSourceCode(page: Page): Promise<string> {
  const r = await page.request.get("/api/grid/rows?table=sources&start=0&end=1");
  const body = (await r.json()) as { value: { rows: Array<{ code: string }> } };
  const code = body.value.rows[0]?.code;
  expect(code).toBeTruthy();
  return code ?? "";
}

const pageErrors: string[] = [];
test.beforeEach(async ({ page }) => {
  pageErrors.length = 0;
  page.on("pageerror", (e) => pageErrors.push(e.message));
  page.on("response", (r) => {
    if (r.status() >= 500) pageErrors.push(`${r.status()} ${r.url()}`);
  });
  page.on("console", (m) => {
    if (m.type() === "error" && !m.text().includes("favicon") && !m.text().startsWith("Failed to load resource"))
      pageErrors.push(m.text());
  });
  await signIn(page, "production.tess", "/grid?table=pickups");
  await page.goto("/grid?table=pickups");
  await expect(stored(page).locator(".ag-row").first()).toBeVisible();
});

test.afterEach(() => {
  expect(pageErrors).toEqual([]);
});

test("type a row with an error, fix it, save, reload and see it", async ({ page }) => {
  const source = await aSourceCode(page);
  const code = `GE-${run}-1`;
  await typeInto(page, 0, "code", code);
  await typeInto(page, 0, "sourceCode", source);
  await typeInto(page, 0, "material", "used cooking oil");
  await typeInto(page, 0, "observedAt", minuteAgo());
  await typeInto(page, 0, "containers", "2");
  await typeInto(page, 0, "volumeL", "12;5");
  await typeInto(page, 0, "tempC", "18");
  const bad = cell(drafts(page), 0, "volumeL");
  await expect(bad).toHaveClass(/cell-invalid/);
  await bad.click();
  await expect(status(page)).toContainText("not a number");
  await page.getByRole("button", { name: "Save ready rows" }).click();
  await expect(status(page)).toContainText("No row is complete and valid");
  await typeInto(page, 0, "volumeL", "120.5");
  await expect(bad).not.toHaveClass(/cell-invalid/);
  await page.getByRole("button", { name: "Save ready rows" }).click();
  await expect(status(page)).toContainText("Saved 1 row");
  await expect(cell(drafts(page), 0, "massKg")).toHaveText(/^1\d\d\.\d{3}$/); // mass computed on the server
  await page.reload();
  await expect(stored(page).locator(`[col-id="code"]`, { hasText: code })).toBeVisible();
});

test("rows typed but not saved survive a reload of the page", async ({ page }) => {
  const code = `GK-${run}-1`;
  await typeInto(page, 0, "code", code);
  await typeInto(page, 0, "containers", "3");
  await page.reload();
  await expect(cell(drafts(page), 0, "code")).toHaveText(code);
  await expect(cell(drafts(page), 0, "containers")).toHaveText("3");
  await expect(status(page)).toContainText("Restored 1 unsaved row");
});

test("paste a 20-row block with 2 bad rows: 18 save, the 2 stay as drafts with their cells marked", async ({
  page,
}) => {
  const source = await aSourceCode(page);
  const lines = ["Pickup no.\tSource\tMaterial\tObserved\tContainers\tVolume (gal)\tOil temp. (°F)"];
  for (let i = 1; i <= 20; i++) {
    const volume = i === 7 ? "lots" : `${10 + i}.5`;
    const observed = i === 13 ? "2026-13-45" : `${daysAgo(1)} ${String(i % 24).padStart(2, "0")}:00`;
    lines.push(`GP-${run}-${i}\t${source}\tused cooking oil\t${observed}\t1\t${volume}\t68`);
  }
  await pasteAt(page, 0, "code", lines.join("\r\n"));
  await expect(status(page)).toContainText("Pasted 20 rows (header row used): 18 ready, 2 with problems");
  await expect(drafts(page).locator(".cell-invalid")).toHaveCount(2);
  await page.getByRole("button", { name: "Save ready rows" }).click();
  await expect(status(page)).toContainText("Saved 18 rows");
  await expect(status(page)).toContainText("2 rows are still drafts with problems");
  const r = await page.request.get(
    `/api/grid/rows?table=pickups&start=0&end=50&filter=${encodeURIComponent(JSON.stringify({ code: { filterType: "text", type: "startsWith", filter: `GP-${run}-` } }))}`,
  );
  const body = (await r.json()) as {
    value: { lastRow: number; rows: Array<{ code: string; volumeL: number; tempC: number }> };
  };
  expect(body.value.lastRow).toBe(18);
  const first = body.value.rows.find((x) => x.code === `GP-${run}-1`);
  expect(first?.volumeL).toBeCloseTo(11.5 * 3.785411784, 2); // NIST HB 44 App. C: 1 US gal = 3.785411784 L
  expect(first?.tempC).toBeCloseTo(20, 6); // 68 °F = 20 °C
});

test("fill down and undo it, then redo", async ({ page }) => {
  for (let i = 0; i < 4; i++) await typeInto(page, i, "code", `GF-${run}-${i}`);
  await typeInto(page, 0, "material", "tallow");
  await cell(drafts(page), 0, "material").click();
  for (let i = 0; i < 3; i++) await page.keyboard.press("Shift+ArrowDown");
  await expect(drafts(page).locator(".cell-in-range")).toHaveCount(4);
  await page.keyboard.press("ControlOrMeta+d");
  await expect(status(page)).toContainText("Filled down 3 cells");
  for (let i = 1; i < 4; i++) await expect(cell(drafts(page), i, "material")).toHaveText(/^tallow$/i);
  await page.keyboard.press("ControlOrMeta+z");
  await expect(status(page)).toContainText("Undone: fill down");
  for (let i = 1; i < 4; i++) await expect(cell(drafts(page), i, "material")).toHaveText("");
  await expect(cell(drafts(page), 0, "material")).toHaveText(/^tallow$/i);
  await page.keyboard.press("ControlOrMeta+y");
  await expect(cell(drafts(page), 3, "material")).toHaveText(/^tallow$/i);
  await page.keyboard.press("Delete");
  await expect(status(page)).toContainText("Cleared");
  await page.keyboard.press("ControlOrMeta+z");
  await expect(cell(drafts(page), 3, "material")).toHaveText(/^tallow$/i);
});

test("import a CSV with errors: a preview names row and column, nothing is written", async ({ page }) => {
  const source = await aSourceCode(page);
  const csv = [
    "Pickup no.,Source,Material,Observed,Containers,Volume (L),Oil temp. (°C)",
    `GI-${run}-1,${source},used cooking oil,${daysAgo(2)} 08:00,1,"1,200.5",20`,
    `GI-${run}-2,${source},used cooking oil,${daysAgo(2)} 09:00,0,100,20`,
    `GI-${run}-3,NO-SUCH-SOURCE,used cooking oil,${daysAgo(2)} 10:00,1,100,20`,
    `GI-${run}-4,${source},used cooking oil,${daysAgo(2)} 11:00,1,100,"20`,
  ].join("\r\n");
  await page
    .locator('input[type="file"]')
    .setInputFiles({ name: "pickups.csv", mimeType: "text/csv", buffer: Buffer.from(`\uFEFF${csv}`, "utf8") });
  const preview = page.getByRole("region", { name: /Import preview/ });
  await expect(preview).toBeVisible();
  await expect(preview.getByRole("list", { name: "Import problems" })).toContainText('Row 3, column "Containers"');
  await expect(preview.getByRole("list", { name: "Import problems" })).toContainText("Row 5");
  await expect(preview.getByRole("button", { name: /Import \d+ rows/ })).toBeDisabled();
  const r = await page.request.get(
    `/api/grid/rows?table=pickups&start=0&end=10&filter=${encodeURIComponent(JSON.stringify({ code: { filterType: "text", type: "startsWith", filter: `GI-${run}-` } }))}`,
  );
  expect(((await r.json()) as { value: { lastRow: number } }).value.lastRow).toBe(0);
});

test("export the whole filtered view and re-import it: nothing changes", async ({ page }) => {
  await page.goto("/grid?table=sources");
  await expect(stored(page).locator(".ag-row").first()).toBeVisible();
  const download = page.waitForEvent("download");
  await page.getByRole("link", { name: "Export CSV" }).click();
  const file = await (await download).path();
  const text = readFileSync(file, "utf8");
  const lines = text.trim().split(/\r\n/);
  const count = (
    (await (await page.request.get("/api/grid/rows?table=sources&start=0&end=1")).json()) as {
      value: { lastRow: number };
    }
  ).value.lastRow;
  expect(lines.length - 1).toBe(count); // the whole view, not only the loaded block
  expect(lines[0]).toContain("Code");
  await page
    .locator('input[type="file"]')
    .setInputFiles({ name: "sources.csv", mimeType: "text/csv", buffer: readFileSync(file) });
  const preview = page.getByRole("region", { name: /Import preview/ });
  await expect(preview).toContainText(`0 new`);
  await expect(preview).toContainText(`${count} already stored and unchanged`);
  await expect(preview).toContainText("0 with problems");
  const xlsx = await page.request.get("/api/grid/export?table=sources&format=xlsx");
  expect(xlsx.headers()["content-type"]).toContain("spreadsheetml");
  expect((await xlsx.body()).subarray(0, 2).toString()).toBe("PK");
});

test("the grid page has no serious accessibility violations and fits 1366 px", async ({ page }) => {
  await page.setViewportSize({ width: 1366, height: 768 });
  await page.goto("/grid?table=lots");
  await expect(stored(page).locator(".ag-row").first()).toBeVisible();
  const results = await new AxeBuilder({ page }).analyze();
  const serious = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(serious.map((v) => `${v.id}: ${v.nodes.length} × ${v.help}`)).toEqual([]);
  const width = await page.evaluate(() => document.documentElement.scrollWidth);
  expect(width).toBeLessThanOrEqual(1366);
  await page.screenshot({ path: "test-results/grid-1366.png" });
});

test("a 100,000-row table shows its first rows at once and scrolls to its end", async ({ page }) => {
  test.setTimeout(180_000);
  const file = plantDatabase();
  // Test-only data: a separate site with its own user, so the demo plant is left as it is.
  const iso = (ms: number) => new Date(ms).toISOString().replace("Z", "+00:00"); // Prisma's SQLite DateTime text form
  const sql = new Database(file);
  sql.pragma("busy_timeout = 10000");
  const siteCode = `LOAD${run}`;
  const login = `load.${run.toLowerCase()}`;
  sql.transaction(() => {
    const hash = (
      sql.prepare("SELECT passwordHash FROM User WHERE login = 'production.tess'").get() as { passwordHash: string }
    ).passwordHash;
    const site = sql
      .prepare(
        "INSERT INTO Site (code, name, town, timeZone, createdAt) VALUES (?, 'Load Test Works', 'Nowhere', 'UTC', ?)",
      )
      .run(siteCode, iso(Date.now())).lastInsertRowid;
    const user = sql
      .prepare(
        "INSERT INTO User (siteId, login, fullName, role, unitSystem, passwordHash, createdAt) VALUES (?, ?, 'Load Tester', 'PRODUCTION', 'us', ?, ?)",
      )
      .run(site, login, hash, iso(Date.now())).lastInsertRowid;
    const source = sql
      .prepare(
        "INSERT INTO Source (siteId, code, name, kind, materials, createdAt) VALUES (?, 'LS1', 'Load Source', 'RESTAURANT', 'USED_COOKING_OIL', ?)",
      )
      .run(site, iso(Date.now())).lastInsertRowid;
    const holder = sql.prepare("INSERT INTO Holder (siteId, kind, code, stockG) VALUES (?, 'PICKUP', ?, 0)");
    const pickup = sql.prepare(
      "INSERT INTO Pickup (siteId, holderId, code, sourceId, collectorId, material, observedAt, receivedAt, containers, volumeMl, tempC, massG) VALUES (?, ?, ?, ?, ?, 'USED_COOKING_OIL', ?, ?, 1, ?, 20, ?)",
    );
    const t0 = Date.UTC(2020, 0, 1);
    for (let i = 1; i <= 100_000; i++) {
      const code = `L${String(i).padStart(6, "0")}`;
      const h = holder.run(site, code).lastInsertRowid;
      const at = t0 + i * 60_000;
      pickup.run(site, h, code, source, user, iso(at), iso(at), 100_000 + i, 92_000 + i);
    }
  })();
  sql.close();
  await page.context().clearCookies();
  await signIn(page, login, "/grid?table=pickups");
  const started = Date.now();
  await page.goto("/grid?table=pickups");
  await expect(stored(page).locator('[col-id="code"]', { hasText: "L100000" })).toBeVisible();
  const firstRowsMs = Date.now() - started;
  console.log(`first rows of 100,000 shown after ${firstRowsMs} ms`);
  await expect(stored(page).locator(".ag-row-pinned")).toContainText("Total, 100,000 rows");
  await expect(stored(page).locator('.ag-header-cell[col-id="volumeL"]')).toContainText("gal");
  await stored(page).locator('[col-id="code"]', { hasText: "L100000" }).click();
  await page.keyboard.press("ControlOrMeta+End");
  const last = stored(page).locator('.ag-row:not(.ag-row-pinned) [col-id="code"]', { hasText: "L000001" });
  for (let i = 0; i < 40 && !(await last.isVisible()); i++) {
    await page.keyboard.press("PageDown");
    await page.keyboard.press("ControlOrMeta+End");
    await page.waitForTimeout(250);
  }
  await expect(last).toBeVisible({ timeout: 30_000 });
});
