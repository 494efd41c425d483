import { request as playwrightRequest } from "@playwright/test";
import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// The administrator adds a colleague, the colleague signs in, and disabling the account ends their
// session at once (their next API call is refused) — OWASP ASVS 5.0 V7.4 session termination.
test("an administrator adds an account, and disabling it ends its session at once", async ({ page, baseURL }) => {
  await signIn(page, "admin.jory", "/admin/users");
  await expect(page.getByRole("heading", { name: "Accounts" })).toBeVisible();
  const create = page.getByRole("form", { name: "New account" });

  // Bad input keeps what was typed (except the password) and names the fields.
  await create.getByLabel("User name").fill("x");
  await create.getByLabel("Full name").fill("Wen Ashby");
  await create.getByLabel("First password").fill("short");
  await create.getByRole("button", { name: "Create account" }).click();
  await expect(create.getByText(/User name: 3 to 80 characters/)).toBeVisible();
  await expect(create.getByText(/Password: at least 8 characters/)).toBeVisible();
  await expect(create.getByLabel("Full name")).toHaveValue("Wen Ashby");

  await create.getByLabel("User name").fill("collector.wen");
  await create.getByLabel("Role").selectOption("COLLECTOR");
  await create.getByLabel("First password").fill("kerbside pickups daily");
  await create.getByRole("button", { name: "Create account" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Account collector.wen created" })).toBeVisible();

  const wen = await playwrightRequest.newContext({ baseURL });
  expect(
    (await wen.post("/api/session", { data: { login: "collector.wen", password: "kerbside pickups daily" } })).status(),
  ).toBe(200);
  // Signed in: the server knows the session (a collector is refused tank stock by the read matrix, not asked to sign in).
  expect((await wen.get("/api/holders/TANK/T1")).status()).toBe(403);

  await page.reload();
  const row = page.getByRole("row").filter({ hasText: "collector.wen" });
  await expect(row.getByRole("cell", { name: "1", exact: true })).toBeVisible(); // one live session
  await row.getByText("Manage collector.wen").click();
  const change = row.getByRole("form", { name: "Change collector.wen" });
  await change.getByLabel("Account").selectOption("no");
  await change.getByRole("button", { name: "Save change" }).click();
  await expect(change.locator(".field-error")).toContainText("Reason");
  await expect(change.getByLabel("Account")).toHaveValue("no"); // the choice survives the refusal
  await change.getByLabel("Reason").fill("Seasonal contract ended");
  await change.getByRole("button", { name: "Save change" }).click();
  await expect(change.getByRole("status")).toContainText("session");

  expect((await wen.get("/api/holders/TANK/T1")).status()).toBe(401);
  expect(
    (await wen.post("/api/session", { data: { login: "collector.wen", password: "kerbside pickups daily" } })).status(),
  ).not.toBe(200);

  // The account's history shows both events with the reason.
  await page.reload();
  await page.getByRole("link", { name: "History of account collector.wen" }).click();
  await expect(page.getByRole("cell", { name: "Seasonal contract ended" })).toBeVisible();
});

test("only an administrator sees account management", async ({ page }) => {
  await signIn(page, "compliance.nell", "/admin/users");
  await expect(page.getByRole("heading", { name: "Not available to your role" })).toBeVisible();
  await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Accounts" })).toHaveCount(0);
  await expect(page.getByRole("form", { name: "New account" })).toHaveCount(0);
});

test("a collector's pickup list holds only their own entries", async ({ page }) => {
  await signIn(page, "collector.ivo", "/pickups");
  await expect(page.getByText("Your pickups")).toBeVisible();
  const me = (await page.locator("header").innerText()).match(/Ivo \w+/)?.[0];
  expect(me, "the header names the signed-in collector").toBeTruthy();
  const collectors = await page.locator("tbody tr td:nth-child(4)").allInnerTexts();
  expect(collectors.length).toBeGreaterThan(0);
  expect(new Set(collectors)).toEqual(new Set([me]));
});

test("anyone sets their own units; another person's account history stays private", async ({ page }) => {
  await signIn(page, "collector.mira", "/");
  await page.getByRole("link", { name: "Mira Tolvane" }).click();
  await expect(page.getByRole("heading", { name: "Your settings" })).toBeVisible();
  await page.getByLabel(/US — lb, US gallons/).check();
  await page.getByRole("button", { name: "Save" }).click();
  await expect(page.getByRole("status")).toContainText("US units");
  await page.reload();
  await expect(page.getByLabel(/US — lb, US gallons/)).toBeChecked();
  await page.goto("/history?kind=user&key=admin.jory");
  await expect(page.locator("p.form-error[role=alert]")).toContainText("owner and to administrators");
  await page.goto("/history?kind=user&key=collector.mira");
  await expect(page.getByRole("cell", { name: "own preference" })).toBeVisible();
});

// OWASP ASVS 5.0 V6.4.2 style: a password set by someone else is used once, then replaced by its owner.
test("a colleague signs in with the password the administrator gave and must choose their own first", async ({
  page,
  browser,
}) => {
  await signIn(page, "admin.jory", "/admin/users");
  const create = page.getByRole("form", { name: "New account" });
  const login = `collector.new${Date.now() % 100000}`;
  await create.getByLabel("User name").fill(login);
  await create.getByLabel("Full name").fill("Orrin Vale");
  await create.getByLabel("Role").selectOption("COLLECTOR");
  await create.getByLabel("First password").fill("given at the counter");
  await create.getByRole("button", { name: "Create account" }).click();
  await expect(page.getByRole("status").filter({ hasText: `Account ${login} created` })).toBeVisible();

  const context = await browser.newContext();
  const colleague = await context.newPage();
  await colleague.goto("/login?next=%2Fpickups");
  await colleague.getByLabel("User name").fill(login);
  await colleague.getByLabel("Password").fill("given at the counter");
  await colleague.getByRole("button", { name: "Sign in" }).click();
  await expect(colleague.getByRole("heading", { name: "Choose your own password" })).toBeVisible({ timeout: 15_000 });
  await colleague.goto("/pickups");
  await expect(colleague).toHaveURL(/\/me\/password$/);
  const form = colleague.getByRole("form", { name: "Your password" });
  await form.getByLabel("Password you were given").fill("given at the counter");
  await form.getByLabel("New password", { exact: true }).fill("kettle lantern orchard");
  await form.getByLabel("New password again").fill("kettle lantern orchrad");
  await form.getByRole("button", { name: "Save my password" }).click();
  await expect(form.getByText("The two new passwords differ")).toBeVisible();
  await form.getByLabel("Password you were given").fill("given at the counter");
  await form.getByLabel("New password", { exact: true }).fill("kettle lantern orchard");
  await form.getByLabel("New password again").fill("kettle lantern orchard");
  await form.getByRole("button", { name: "Save my password" }).click();
  await expect(colleague).toHaveURL(/\/collect/);
  await colleague.goto("/pickups");
  await expect(colleague.getByRole("heading", { level: 1 })).not.toHaveText("Choose your own password");
  await context.close();
});
