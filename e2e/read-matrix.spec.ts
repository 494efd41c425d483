import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { request as playwrightRequest } from "@playwright/test";
import { expect, test } from "./support/test";
import type { APIRequestContext } from "@playwright/test";
import { homeFor, readRuleFor, readersOf } from "../lib/auth/read-matrix";
import type { SiteRole } from "../lib/core/vocabulary";

// OWASP ASVS 5.0 V8.2.1 (function-level) and V8.2.2 (data-specific) authorisation, for reading: every
// page and GET route of the build × every role and anonymous, against the one read matrix.
const ROLES: SiteRole[] = ["COLLECTOR", "PRODUCTION", "COMPLIANCE", "ADMIN"];
const LOGINS: Record<SiteRole, string> = {
  COLLECTOR: "collector.ivo",
  PRODUCTION: "production.tess",
  COMPLIANCE: "compliance.nell",
  ADMIN: "admin.jory",
};
const root = path.resolve(import.meta.dirname, "..");

interface BuiltRoute {
  path: string;
  kind: "page" | "get";
}

/** Pages and GET route handlers of the production build (Next's app-path-routes manifest). */
function builtRoutes(): BuiltRoute[] {
  const dist = path.join(root, process.env.NEXT_DIST_DIR ?? ".next");
  const manifest = JSON.parse(readFileSync(path.join(dist, "app-path-routes-manifest.json"), "utf8")) as Record<
    string,
    string
  >;
  const out: BuiltRoute[] = [];
  for (const [entry, url] of Object.entries(manifest)) {
    if (entry.startsWith("/_")) continue; // Next's own (not-found, global error)
    if (entry.endsWith("/page")) out.push({ path: url, kind: "page" });
    else if (entry.endsWith("/route")) {
      const file = path.join(root, "app", `${entry}.ts`);
      if (!existsSync(file)) continue; // a file served as is (the icon)
      if (/export (async )?function GET\b|export const GET\b/.test(readFileSync(file, "utf8")))
        out.push({ path: url, kind: "get" });
    }
  }
  return out.map((r) => ({ ...r, path: r.path.replace(/\[[^\]]+\]/g, "NO-SUCH-RECORD") }));
}

async function signedIn(baseURL: string | undefined): Promise<Map<SiteRole, APIRequestContext>> {
  const m = new Map<SiteRole, APIRequestContext>();
  for (const role of ROLES) {
    const ctx = await playwrightRequest.newContext({ baseURL });
    expect(
      (await ctx.post("/api/session", { data: { login: LOGINS[role], password: "quillmoor-demo" } })).status(),
    ).toBe(200);
    m.set(role, ctx);
  }
  return m;
}

test("every page and GET route answers each role as the read matrix says", async ({ baseURL }) => {
  test.setTimeout(300_000);
  const routes = builtRoutes();
  expect(routes.length).toBeGreaterThan(40);
  const missing = routes.filter((r) => readRuleFor(r.path) === null).map((r) => r.path);
  expect(missing, "add these routes to lib/auth/read-matrix.ts").toEqual([]);
  const anonymous = await playwrightRequest.newContext({ baseURL });
  const asRole = await signedIn(baseURL);
  const failures: string[] = [];
  let refusals = 0;
  for (const r of routes) {
    const readers = readersOf(r.path);
    if (readers === "public") continue;
    const anon = await anonymous.get(r.path, { maxRedirects: 0 });
    const anonOk = !r.path.startsWith("/api/")
      ? anon.status() === 307 && (anon.headers()["location"] ?? "").includes("/login")
      : anon.status() === 401;
    if (!anonOk) failures.push(`${r.path} anonymous → ${anon.status()}`);
    for (const role of ROLES) {
      const res = await asRole.get(role)!.get(r.path, { maxRedirects: 0 });
      const status = res.status();
      if (status >= 500) failures.push(`${r.path} as ${role} → ${status}`);
      if (readers.includes(role)) {
        if (status === 401 || status === 403)
          failures.push(`${r.path} as ${role} → ${status}, expected to be let through`);
      } else if (r.path === "/" && homeFor(role) !== "/") {
        if (!(status === 307 && res.headers()["location"]?.endsWith(homeFor(role))))
          failures.push(`/ as ${role} → ${status}, expected a redirect to ${homeFor(role)}`);
      } else {
        refusals += 1;
        if (status !== 403) failures.push(`${r.path} as ${role} → ${status}, expected 403`);
        const body = await res.text();
        // A refusal carries no data: the page says so in plain words; JSON says which roles may read.
        if (r.kind === "page" && !body.includes("Not available to your role"))
          failures.push(`${r.path} as ${role}: no plain refusal`);
      }
    }
  }
  expect(refusals).toBeGreaterThan(20);
  expect(failures).toEqual([]);
});

test("a collector's phone menu holds only the collector's own pages", async ({ page }) => {
  await page.setViewportSize({ width: 360, height: 740 });
  await page.goto("/login?next=%2F");
  await page.getByLabel("User name").fill("collector.ivo");
  await page.getByLabel("Password").fill("quillmoor-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/collect/, { timeout: 30_000 }); // a fresh server opens its first page
  const menu = page.getByRole("button", { name: /^Menu/ });
  await expect(menu).toBeVisible();
  await menu.click();
  const links = await page.getByRole("navigation", { name: "Main" }).getByRole("link").allInnerTexts();
  expect(links).toEqual(["Collect", "Pickups", "Sources", "Labels"]);
  await page.screenshot({ path: test.info().outputPath("collector-menu-360.png"), fullPage: false });
  await page.goto("/balance");
  await expect(page.getByRole("heading", { name: "Not available to your role" })).toBeVisible();
});
