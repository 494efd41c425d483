import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { expect, request as playwrightRequest, test } from "@playwright/test";
import type { APIRequestContext } from "@playwright/test";

// OWASP ASVS 5.0 V8.2.1: function-level authorisation on the server. Every data-changing route handler
// is called directly — as each role and anonymously — and must refuse exactly the roles not allowed.
type Role = "COLLECTOR" | "PRODUCTION" | "COMPLIANCE" | "ADMIN";
const ANY: Role[] = ["COLLECTOR", "PRODUCTION", "COMPLIANCE", "ADMIN"];
const LOGINS: Record<Role, string> = { COLLECTOR: "collector.ivo", PRODUCTION: "production.tess", COMPLIANCE: "compliance.nell", ADMIN: "admin.jory" };

/** Who may call each POST route. A route missing here fails the test until someone decides. "public" = no sign-in. */
const MATRIX: Record<string, Role[] | "public"> = {
  "/api/session": "public",
  "/api/pickups": ["COLLECTOR", "PRODUCTION"],
  "/api/pickups/import": ["PRODUCTION"],
  "/api/transfers": ["PRODUCTION"],
  "/api/tanks": ["PRODUCTION"],
  "/api/lab/titrations": ["PRODUCTION"],
  "/api/lab/tests": ["PRODUCTION"],
  "/api/batches/plan": ["PRODUCTION"],
  "/api/periods/close": ["COMPLIANCE"],
  "/api/periods/reopen": ["COMPLIANCE"],
};
const COMPUTE_PREFIX = "/api/compute/"; // pure computations: any signed-in user

function postRoutes(dir: string, base = ""): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...postRoutes(p, `${base}/${e.name}`));
    else if (e.name === "route.ts" && /export (async )?function POST\b/.test(readFileSync(p, "utf8"))) out.push(`/api${base}`);
  }
  return out;
}

test("every data-changing route refuses anonymous callers and the roles it does not allow", async ({ baseURL }) => {
  const routes = postRoutes(path.resolve(import.meta.dirname, "..", "app", "api")).filter((r) => !r.includes("["));
  expect(routes.length).toBeGreaterThan(3);
  const missing = routes.filter((r) => !(r in MATRIX) && !r.startsWith(COMPUTE_PREFIX));
  expect(missing, "add these routes to the authorisation matrix").toEqual([]);
  const anonymous = await playwrightRequest.newContext({ baseURL });
  const asRole = new Map<Role, APIRequestContext>();
  for (const role of ANY) {
    const ctx = await playwrightRequest.newContext({ baseURL });
    expect((await ctx.post("/api/session", { data: { login: LOGINS[role], password: "quillmoor-demo" } })).status()).toBe(200);
    asRole.set(role, ctx);
  }
  const failures: string[] = [];
  for (const route of routes) {
    const allowed = route.startsWith(COMPUTE_PREFIX) ? ANY : MATRIX[route];
    if (allowed === "public" || allowed === undefined) continue;
    const call = (ctx: APIRequestContext) => ctx.post(route, { headers: { "idempotency-key": `authz-${Math.random().toString(36).slice(2, 12)}` }, data: {} });
    const anon = (await call(anonymous)).status();
    if (anon !== 401) failures.push(`${route} anonymous → ${anon}, expected 401`);
    for (const role of ANY) {
      const status = (await call(asRole.get(role)!)).status();
      const ok = allowed.includes(role);
      if (ok && (status === 401 || status === 403)) failures.push(`${route} as ${role} → ${status}, expected to be let through`);
      if (!ok && status !== 403) failures.push(`${route} as ${role} → ${status}, expected 403`);
      if (status >= 500) failures.push(`${route} as ${role} → ${status}`);
    }
  }
  expect(failures).toEqual([]);
});
