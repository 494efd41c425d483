import { expect, test } from "./support/test";

test("a wrong password is refused with a message and the user name kept", async ({ page }) => {
  await page.goto("/lots");
  await expect(page).toHaveURL(/\/login\?next=%2Flots/);
  await page.getByLabel("User name").fill("production.tess");
  await page.getByLabel("Password").fill("not the password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "wrong" })).toHaveText("User name or password is wrong");
  await expect(page.getByLabel("User name")).toHaveValue("production.tess");
  await page.getByLabel("Password").fill("quillmoor-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/lots$/, { timeout: 30_000 }); // a fresh server opens its first page
  await expect(page.getByRole("heading", { level: 1 })).toContainText(/lots/i);
  const cookies = await page.context().cookies();
  const session = cookies.find((c) => c.name === "tv_session");
  expect(session?.httpOnly).toBe(true);
  expect(session?.sameSite).toBe("Lax");
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/login/);
  await page.goto("/lots");
  await expect(page).toHaveURL(/\/login/);
});
