import AxeBuilder from "@axe-core/playwright";
import { expect, test } from "./support/test";
import { signIn } from "./support/sign-in";

// WCAG 2.1 AA as checked by axe-core: no serious or critical violations on the pages each role uses
// most, at a 1366-pixel laptop width.
const PAGES: Array<[string, string[]]> = [
  ["production.tess", ["/", "/lots", "/lab", "/plan", "/tanks", "/batches", "/ledger", "/me"]],
  ["compliance.nell", ["/trace", "/balance", "/balance/custody", "/waste", "/waste/due", "/periods", "/products"]],
  ["admin.jory", ["/admin/users"]],
];

for (const [login, paths] of PAGES) {
  test(`pages used by ${login} have no serious accessibility violations`, async ({ page }) => {
    test.setTimeout(240_000); // up to eight pages, each loaded for the first time on this journey's own server
    await page.setViewportSize({ width: 1366, height: 768 });
    await signIn(page, login, paths[0]);
    const found: string[] = [];
    for (const path of paths) {
      await page.goto(path);
      await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
      const results = await new AxeBuilder({ page }).analyze();
      for (const v of results.violations.filter((x) => x.impact === "serious" || x.impact === "critical")) {
        found.push(`${path} ${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
      }
    }
    expect(found).toEqual([]);
  });
}
