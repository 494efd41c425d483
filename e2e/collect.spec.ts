import AxeBuilder from "@axe-core/playwright";
import Database from "better-sqlite3";
import { plantDatabase } from "./support/plant";
import { expect, test } from "./support/test";
import type { Page } from "@playwright/test";
import { signIn } from "./support/sign-in";

// The collector's phone page offline: entries wait in IndexedDB, survive a reload (service worker copy of
// the page), and reach the server exactly once — also when an answer is lost or the session has ended.

interface Waiting {
  key: string;
  pickup: { code: string; observedAt: string } & Record<string, unknown>;
}

function stored(
  keys: string[],
): Array<{ idempotencyKey: string; observedAt: string; receivedAt: string; collector: string }> {
  const db = new Database(plantDatabase(), { readonly: true });
  try {
    const marks = keys.map(() => "?").join(",");
    return db
      .prepare(
        `SELECT p.idempotencyKey, p.observedAt, p.receivedAt, u.login AS collector FROM Pickup p JOIN User u ON u.id = p.collectorId WHERE p.idempotencyKey IN (${marks})`,
      )
      .all(...keys) as Array<{ idempotencyKey: string; observedAt: string; receivedAt: string; collector: string }>;
  } finally {
    db.close();
  }
}

async function outbox(page: Page): Promise<Waiting[]> {
  return page.evaluate(
    () =>
      new Promise<Waiting[]>((resolve, reject) => {
        const open = indexedDB.open("tracevat-collect");
        open.onerror = () => reject(open.error ?? new Error("the outbox database did not open"));
        open.onsuccess = () => {
          const req = open.result.transaction("entries").objectStore("entries").getAll();
          req.onsuccess = () => {
            resolve(req.result as Waiting[]);
            open.result.close();
          };
          req.onerror = () => reject(req.error ?? new Error("the outbox could not be read"));
        };
      }),
  );
}

async function openCollect(page: Page, login = "collector.ivo"): Promise<void> {
  await signIn(page, login, "/collect");
  await expect(page.getByRole("heading", { name: "Collect", exact: true })).toBeVisible();
  await expect(page.locator('.collect-app[data-outbox-ready="1"]')).toBeVisible();
  await expect(page.locator('.collect-app[data-offline-ready="1"]')).toBeVisible({ timeout: 30_000 });
}

/** Picks a stop on today's route, or (when earlier pickups emptied the route) types a known source code. */
async function pickSource(page: Page, i: number, avoid = ""): Promise<void> {
  const stops = page.locator(".collect-stop:not(.picked)");
  const n = await stops.count();
  if (n > 0) return stops.nth(i % Math.min(5, n)).click();
  const codes = (
    await page.locator("#collect-sources option").evaluateAll((os) => os.map((o) => (o as HTMLOptionElement).value))
  ).filter((c) => c !== avoid);
  await page.locator("#field-sourceCode").fill(codes[i % codes.length]!);
}

async function enterPickup(page: Page, i: number): Promise<void> {
  await pickSource(page, i);
  await page.getByLabel("Containers", { exact: true }).fill(String(1 + (i % 4)));
  await page.getByLabel(/^Volume \(L/).fill(String(80 + i));
  await page.getByLabel(/^Oil temperature/).fill("19");
  await page.getByRole("button", { name: "Save pickup" }).click();
  await expect(page.locator(".collect-saved")).toContainText("kept on this phone");
}

const waitingCount = (page: Page) => page.locator(".collect-count");

test("phone-size screenshot: 360 × 740, nothing wider than the screen", async ({ browser, baseURL }) => {
  const context = await browser.newContext({
    baseURL,
    viewport: { width: 360, height: 740 },
    isMobile: true,
    hasTouch: true,
    deviceScaleFactor: 2,
  });
  const page = await context.newPage();
  await openCollect(page);
  await pickSource(page, 0);
  await expect(page.locator(".collect-source")).toBeVisible();
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360);
  const save = await page.getByRole("button", { name: "Save pickup" }).boundingBox();
  expect(save?.height ?? 0).toBeGreaterThanOrEqual(48); // WCAG 2.2 SC 2.5.8 asks ≥ 24 px; 48 px is common practice for touch
  await page.locator(".collect-app").scrollIntoViewIfNeeded();
  await page.screenshot({ path: "test-results/collect-360x740.png" });
  await page.screenshot({ path: "test-results/collect-360x740-full.png", fullPage: true });
  const axe = await new AxeBuilder({ page }).include(".collect-app").analyze(); // WCAG 2.x rules as axe-core implements them
  expect(axe.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`)).toEqual([]);
  await context.close();
});

test("offline: 20 pickups survive a reload and arrive exactly once with their observed times", async ({
  page,
  context,
}) => {
  await openCollect(page);
  await context.setOffline(true);
  await expect(page.locator(".collect-net")).toHaveText("No connection");
  for (let i = 0; i < 20; i++) await enterPickup(page, i);
  await expect(waitingCount(page)).toHaveText("20 waiting");

  const reload = await page.reload();
  expect(
    reload?.headers()["x-tracevat-offline-copy"],
    "the reload was answered by the service worker's offline copy",
  ).toBe("1");
  await expect(page.locator('.collect-app[data-outbox-ready="1"]')).toBeVisible();
  await expect(waitingCount(page)).toHaveText("20 waiting");
  await expect(page.locator(".collect-waiting .collect-list li")).toHaveCount(20);
  const before = await outbox(page);
  expect(before).toHaveLength(20);
  expect(stored(before.map((e) => e.key))).toEqual([]);

  await context.setOffline(false);
  await expect(waitingCount(page)).toHaveText("All sent", { timeout: 45_000 });
  expect(await outbox(page)).toEqual([]);
  const rows = stored(before.map((e) => e.key));
  expect(rows).toHaveLength(20);
  for (const e of before) {
    const row = rows.filter((r) => r.idempotencyKey === e.key);
    expect(row, e.pickup.code).toHaveLength(1);
    expect(new Date(row[0]!.observedAt).toISOString()).toBe(e.pickup.observedAt);
    expect(new Date(row[0]!.receivedAt).getTime()).toBeGreaterThanOrEqual(new Date(e.pickup.observedAt).getTime());
    expect(row[0]!.collector).toBe("collector.ivo");
  }
  await expect(page.locator(".collect-sent li[data-record-id]")).toHaveCount(20);
});

test("lost answer: the server stored it, the reply never came, the retry records it once", async ({ page }) => {
  await openCollect(page);
  let lost = 0;
  await page.route("**/api/pickups", async (route) => {
    if (lost > 0) return route.continue();
    lost++;
    await route.fetch(); // reaches the server, which stores the pickup …
    await route.abort("internetdisconnected"); // … but the phone never hears back
  });
  await enterPickup(page, 0);
  await expect.poll(() => lost).toBe(1);
  await expect(waitingCount(page)).toHaveText("1 waiting");
  const [entry] = await outbox(page);
  expect(entry).toBeDefined();
  await expect.poll(() => stored([entry!.key]).length).toBe(1);

  await page.getByRole("button", { name: "Send now" }).click();
  await expect(waitingCount(page)).toHaveText("All sent");
  expect(stored([entry!.key])).toHaveLength(1);
  await expect(page.locator(".collect-sent li[data-record-id]")).toHaveCount(1);
});

test("session ended while offline: the phone asks to sign in again, then sends; sign-out warns first", async ({
  page,
  context,
}) => {
  await openCollect(page);
  await context.setOffline(true);
  await enterPickup(page, 0);
  await enterPickup(page, 1);
  await expect(waitingCount(page)).toHaveText("2 waiting");

  // Sign-out with unsent entries asks first; declining keeps the collector here.
  let asked = "";
  page.once("dialog", (d) => {
    asked = d.message();
    void d.dismiss();
  });
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect.poll(() => asked).toContain("2 pickups are still waiting");
  await expect(page).toHaveURL(/\/collect$/);

  // The server ends the session (idle/absolute timeout) while the phone is out of signal.
  const db = new Database(plantDatabase());
  db.prepare(
    "UPDATE Session SET expiresAt = '2020-01-01T00:00:00.000+00:00' WHERE revokedAt IS NULL AND userId = (SELECT id FROM User WHERE login = 'collector.ivo')",
  ).run();
  db.close();
  const waiting = await outbox(page);

  await context.setOffline(false);
  await expect(page.getByRole("heading", { name: "Sign in again to send" })).toBeVisible({ timeout: 45_000 });
  await expect(waitingCount(page)).toHaveText("2 waiting");
  expect(stored(waiting.map((e) => e.key))).toEqual([]);
  await page.locator(".collect-signin").getByLabel("Password").fill("quillmoor-demo");
  await page.getByRole("button", { name: "Sign in and send" }).click();
  await expect(waitingCount(page)).toHaveText("All sent");
  const rows = stored(waiting.map((e) => e.key));
  expect(rows).toHaveLength(2);
  for (const e of waiting)
    expect(new Date(rows.find((r) => r.idempotencyKey === e.key)!.observedAt).toISOString()).toBe(e.pickup.observedAt);

  // Nothing waiting now: signing out asks nothing and drops the offline copy of the signed-in page.
  let askedAgain = false;
  page.once("dialog", (d) => {
    askedAgain = true;
    void d.dismiss();
  });
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/login/);
  expect(askedAgain).toBe(false);
  await expect.poll(() => page.evaluate(() => caches.has("tracevat-collect-shell-v1"))).toBe(false);
  expect(await outbox(page)).toEqual([]);
});

test("two open tabs and a tab closed mid-send: every entry arrives once", async ({ page, context }) => {
  await openCollect(page);
  const second = await context.newPage();
  await second.goto("/collect");
  await expect(second.locator('.collect-app[data-outbox-ready="1"]')).toBeVisible();
  await page.bringToFront();
  await context.setOffline(true);
  for (let i = 0; i < 8; i++) await enterPickup(page, i);
  const keys = (await outbox(page)).map((e) => e.key);
  expect(keys).toHaveLength(8);
  await expect(second.locator(".collect-count")).toHaveText("8 waiting"); // the other tab sees the shared outbox
  // Slow answers, so the first tab can be closed while it is sending.
  let answered = 0;
  await context.route("**/api/pickups", async (route) => {
    const res = await route.fetch();
    answered++;
    await new Promise((r) => setTimeout(r, 150));
    await route.fulfill({ response: res }).catch(() => undefined);
  });
  await context.setOffline(false); // both tabs hear "online" and start sending the same outbox
  await expect.poll(() => answered, { timeout: 20_000 }).toBeGreaterThanOrEqual(2);
  await page.close();
  await expect(second.locator(".collect-count")).toHaveText("All sent", { timeout: 45_000 });
  expect(await outbox(second)).toEqual([]);
  const rows = stored(keys);
  expect(rows).toHaveLength(8);
  expect(new Set(rows.map((r) => r.idempotencyKey)).size).toBe(8);
});

test("eight days without signal: the entry is still waiting, flagged as overdue, then sent with its own time", async ({
  page,
  context,
}) => {
  await openCollect(page);
  await context.setOffline(true);
  await enterPickup(page, 0);
  const [entry] = await outbox(page);
  await page.clock.setFixedTime(new Date(Date.now() + 8 * 24 * 3_600_000));
  await page.reload();
  await expect(waitingCount(page)).toHaveText("1 waiting");
  await expect(page.locator(".collect-waiting")).toContainText("1 entry has waited more than 24 h");
  await expect(page.locator("[data-stale-route]")).toBeVisible(); // the offline copy's route is from 8 days ago
  await context.setOffline(false);
  await expect(waitingCount(page)).toHaveText("All sent");
  expect(new Date(stored([entry!.key])[0]!.observedAt).toISOString()).toBe(entry!.pickup.observedAt);
});

test("a pickup the server refuses stays on the phone, marked with the field, until fixed and sent", async ({
  page,
}) => {
  await openCollect(page);
  // The server's answer when, say, the source was closed while the phone was offline.
  await page.route(
    "**/api/pickups",
    (route) =>
      route.fulfill({
        status: 422,
        contentType: "application/json",
        body: JSON.stringify({
          ok: false,
          issues: [{ code: "SOURCE.INACTIVE", message: "Source is no longer active", field: "sourceCode" }],
        }),
      }),
    { times: 1 },
  );
  await enterPickup(page, 0);
  const refusedRow = page.locator('.collect-waiting li[data-state="REFUSED"]');
  await expect(refusedRow).toContainText("Refused by the server: sourceCode: Source is no longer active");
  await expect(waitingCount(page)).toHaveText("1 waiting");
  await page.getByRole("button", { name: "Send now" }).click(); // a refused entry is not re-sent as it is
  await expect(refusedRow).toHaveCount(1);
  const [before] = await outbox(page);
  await refusedRow.getByRole("button", { name: "Fix" }).click();
  await expect(page.locator("#err-sourceCode")).toHaveText("Source is no longer active");
  const showAll = page.getByRole("button", { name: /^Show all \d+ stops$/ });
  if (await showAll.isVisible()) await showAll.click();
  await pickSource(page, 0, before!.pickup.sourceCode as string);
  await page.getByRole("button", { name: "Save the corrected pickup" }).click();
  await expect(waitingCount(page)).toHaveText("All sent");
  const rows = stored([before!.key]);
  expect(rows).toHaveLength(1);
  expect(new Date(rows[0]!.observedAt).toISOString()).toBe(before!.pickup.observedAt); // the original observation time
});

test("a phone clock two hours ahead is flagged beside the sent pickup", async ({ page }) => {
  await openCollect(page);
  await page.clock.setFixedTime(new Date(Date.now() + 2 * 3_600_000));
  await enterPickup(page, 0);
  await expect(waitingCount(page)).toHaveText("All sent");
  await expect(page.locator(".collect-sent li[data-record-id] .skew-flag")).toContainText(
    /Phone time is (1 h 5\d min|2 h) ahead/,
  );
});

test("bad input is refused on the phone before saving and again on the server, naming the field", async ({
  page,
  context,
}) => {
  await openCollect(page);
  await page.locator("#field-sourceCode").fill("ZZ-NOPE");
  await page.getByLabel("Containers", { exact: true }).fill("2");
  await page.getByLabel(/^Volume \(L/).fill("0");
  await page.getByLabel(/^Oil temperature/).fill("95");
  await page.getByLabel(/^Container labels/).fill("C-1 C-1");
  await page.getByRole("button", { name: "Save pickup" }).click();
  await expect(page.locator("#err-sourceCode")).toHaveText("Source ZZ-NOPE does not exist");
  await expect(page.locator("#err-volumeL")).toContainText("Volume (L) must be more than 0");
  await expect(page.locator("#err-tempC")).toContainText("Oil temperature must be at most 90 °C");
  await expect(page.locator("#err-containerTags")).toContainText("Container label C-1 appears twice");
  await expect(page.getByLabel(/^Volume \(L/)).toHaveValue("0"); // nothing typed is lost
  expect(await outbox(page)).toEqual([]);
  await expect(waitingCount(page)).toHaveText("All sent");

  // Gauge reading: containers × size × fill level; a fill level over 100 % is refused on the gauge fields.
  await page.getByLabel("Gauge reading").check();
  await page.getByLabel(/^Container size/).fill("200");
  await page.getByLabel(/^Fill level/).fill("150");
  await page.getByRole("button", { name: "Save pickup" }).click();
  await expect(page.locator("#err-gauge")).toContainText("Volume (L) must be");
  await page.getByLabel(/^Fill level/).fill("75");
  await pickSource(page, 0);
  await page.getByLabel(/^Oil temperature/).fill("30");
  await page.getByLabel(/^Container labels/).fill("C-1 C-2");
  await context.setOffline(true);
  await page.getByRole("button", { name: "Save pickup" }).click();
  await expect(page.locator(".collect-saved")).toContainText("kept on this phone");
  const [gauged] = await outbox(page);
  expect(gauged?.pickup).toMatchObject({
    volumeL: 300,
    containers: 2,
    containerTags: ["C-1", "C-2"],
    notes: "gauge: 2 × 200 L at 75 %",
  });
  await context.setOffline(false);
  await expect(waitingCount(page)).toHaveText("All sent");

  const key = "0f0f0f0f-0000-4000-8000-000000000001";
  const bad = {
    code: "PU-BAD-1",
    sourceCode: "ZZ-NOPE",
    material: "USED_COOKING_OIL",
    observedAt: new Date().toISOString(),
    containers: 2,
    containerTags: ["C-1", "C-1"],
    volumeL: 0,
    tempC: 95,
    idempotencyKey: key,
  };
  const origin = new URL(page.url()).origin;
  const r1 = await page.request.post("/api/pickups", { headers: { origin, "idempotency-key": key }, data: bad });
  expect(r1.status()).toBe(422);
  const fields1 = ((await r1.json()) as { issues: Array<{ field?: string }> }).issues.map((i) => i.field);
  expect(fields1).toEqual(expect.arrayContaining(["volumeL", "tempC", "containerTags.1"]));
  const r2 = await page.request.post("/api/pickups", {
    headers: { origin, "idempotency-key": key },
    data: { ...bad, containerTags: [], volumeL: 100, tempC: 20 },
  });
  expect(r2.status()).toBe(404);
  expect(((await r2.json()) as { issues: Array<{ field?: string }> }).issues[0]?.field).toBe("sourceCode");
});

test("signing out from any other page also warns while pickups wait in this browser", async ({ page, context }) => {
  await openCollect(page, "collector.odo");
  await context.setOffline(true);
  await enterPickup(page, 3);
  await expect(waitingCount(page)).toHaveText("1 waiting");
  // Keep the entry waiting while the network is back: the server's answer never arrives.
  await page.route("**/api/pickups", (r) => r.abort());
  await context.setOffline(false);
  await page.goto("/pickups");
  let asked = "";
  page.once("dialog", (d) => {
    asked = d.message();
    void d.dismiss();
  });
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect.poll(() => asked).toContain("1 pickup is still waiting");
  await expect(page).toHaveURL(/\/pickups$/);
  await expect(page.getByRole("button", { name: "Sign out" })).toBeVisible();
  // Let it go out, so the browser's outbox is empty for the next journeys.
  await page.unroute("**/api/pickups");
  await page.goto("/collect");
  await expect(waitingCount(page)).toHaveText("All sent", { timeout: 45_000 });
});
