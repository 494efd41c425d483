import type { Page } from "@playwright/test";
import { expect } from "@playwright/test";

/** Demo accounts share the demo password (seeds/names.ts). */
export async function signIn(page: Page, login: string, next = "/"): Promise<void> {
  await page.goto(`/login?next=${encodeURIComponent(next)}`);
  await page.getByLabel("User name").fill(login);
  await page.getByLabel("Password").fill("quillmoor-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("button", { name: "Sign out" })).toBeVisible({ timeout: 30_000 }); // a fresh server loads the page it opens for the first time
}
