import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { request as playwrightRequest } from "@playwright/test";
import { expect, test } from "./support/test";
import type { APIRequestContext } from "@playwright/test";

// OWASP ASVS 5.0 V8.2.1: function-level authorisation on the server. Every data-changing route handler
// is called directly — as each role and anonymously — and must refuse exactly the roles not allowed.
type Role = "COLLECTOR" | "PRODUCTION" | "COMPLIANCE" | "ADMIN";
const ANY: Role[] = ["COLLECTOR", "PRODUCTION", "COMPLIANCE", "ADMIN"];
const LOGINS: Record<Role, string> = {
  COLLECTOR: "collector.ivo",
  PRODUCTION: "production.tess",
  COMPLIANCE: "compliance.nell",
  ADMIN: "admin.jory",
};

/** Who may call each POST route. A route missing here fails the test until someone decides. "public" = no sign-in. */
const MATRIX: Record<string, Role[] | "public"> = {
  "/api/session": "public",
  "/api/pickups": ["COLLECTOR", "PRODUCTION"],
  "/api/pickups/import": ["PRODUCTION"],
  "/api/transfers": ["PRODUCTION"],
  "/api/tanks": ["PRODUCTION"],
  "/api/tanks/gauges": ["PRODUCTION"],
  "/api/receiving/into-tank": ["PRODUCTION"],
  "/api/lab/titrations": ["PRODUCTION"],
  "/api/lab/tests": ["PRODUCTION"],
  "/api/batches/plan": ["PRODUCTION"],
  "/api/batches/propose": ANY, // a proposal over current stock; writes nothing
  "/api/batches/start": ["PRODUCTION"],
  "/api/batches/complete": ["PRODUCTION"],
  "/api/lab/decisions": ["PRODUCTION"],
  "/api/periods/close": ["COMPLIANCE"],
  "/api/periods/reopen": ["COMPLIANCE"],
  "/api/grid/save": ["COLLECTOR", "PRODUCTION"],
  "/api/grid/import": ["PRODUCTION"],
  "/api/waste/containers": ["PRODUCTION", "COMPLIANCE"],
  "/api/waste/characterisation": ["PRODUCTION", "COMPLIANCE"],
  "/api/waste/full": ["PRODUCTION", "COMPLIANCE"],
  "/api/waste/disposals": ["COMPLIANCE"],
  "/api/customers": ["COMPLIANCE"],
  "/api/shipments": ["COMPLIANCE"],
  "/api/specs": ["COMPLIANCE"],
  "/api/products/qc": ["PRODUCTION", "COMPLIANCE"],
  "/api/products/spec": ["COMPLIANCE"],
  "/api/products/decisions": ["COMPLIANCE"],
};
const COMPUTE_PREFIX = "/api/compute/"; // pure computations: any signed-in user

/** One request context per role, each signed in through the API. */
async function signedInAsEachRole(baseURL: string | undefined): Promise<Map<Role, APIRequestContext>> {
  const asRole = new Map<Role, APIRequestContext>();
  for (const role of ANY) {
    const ctx = await playwrightRequest.newContext({ baseURL });
    expect(
      (await ctx.post("/api/session", { data: { login: LOGINS[role], password: "quillmoor-demo" } })).status(),
    ).toBe(200);
    asRole.set(role, ctx);
  }
  return asRole;
}

function postRoutes(dir: string, base = ""): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...postRoutes(p, `${base}/${e.name}`));
    else if (
      e.name === "route.ts" &&
      /export (async )?function POST\b|export const POST\b/.test(readFileSync(p, "utf8"))
    )
      out.push(`/api${base}`);
  }
  return out;
}

test("every data-changing route refuses anonymous callers and the roles it does not allow", async ({ baseURL }) => {
  const routes = postRoutes(path.resolve(import.meta.dirname, "..", "app", "api")).filter((r) => !r.includes("["));
  expect(routes.length).toBeGreaterThan(3);
  const missing = routes.filter((r) => !(r in MATRIX) && !r.startsWith(COMPUTE_PREFIX));
  expect(missing, "add these routes to the authorisation matrix").toEqual([]);
  const anonymous = await playwrightRequest.newContext({ baseURL });
  const asRole = await signedInAsEachRole(baseURL);
  const failures: string[] = [];
  for (const route of routes) {
    const allowed = route.startsWith(COMPUTE_PREFIX) ? ANY : MATRIX[route];
    if (allowed === "public" || allowed === undefined) continue;
    const call = (ctx: APIRequestContext) =>
      ctx.post(route, { headers: { "idempotency-key": `authz-${Math.random().toString(36).slice(2, 12)}` }, data: {} });
    const anon = (await call(anonymous)).status();
    if (anon !== 401) failures.push(`${route} anonymous → ${anon}, expected 401`);
    for (const role of ANY) {
      const status = (await call(asRole.get(role)!)).status();
      const ok = allowed.includes(role);
      if (ok && (status === 401 || status === 403))
        failures.push(`${route} as ${role} → ${status}, expected to be let through`);
      if (!ok && status !== 403) failures.push(`${route} as ${role} → ${status}, expected 403`);
      if (status >= 500) failures.push(`${route} as ${role} → ${status}`);
    }
  }
  expect(failures).toEqual([]);
});

/** Who may call each server action (by exported name). An action missing here fails the test until someone decides. */
const ACTIONS: Record<string, Role[] | "public"> = {
  signInAction: "public",
  signOutAction: "public",
  closePeriodAction: ["COMPLIANCE"],
  reopenPeriodAction: ["COMPLIANCE"],
  recordTitrationAction: ["PRODUCTION"],
  recordLabTestAction: ["PRODUCTION"],
  decideLotAction: ["PRODUCTION"],
  recordPlanAction: ["PRODUCTION"],
  startBatchAction: ["PRODUCTION"],
  completeBatchAction: ["PRODUCTION"],
  correctBatchOutputAction: ["PRODUCTION"],
  receivePickupsAction: ["PRODUCTION"],
  moveToTankAction: ["PRODUCTION"],
  recordGaugeAction: ["PRODUCTION"],
  createUserAction: ["ADMIN"],
  changeUserAction: ["ADMIN"],
  resetPasswordAction: ["ADMIN"],
  endSessionsAction: ["ADMIN"],
  unlockSignInAction: ["ADMIN"],
  setGs1PrefixAction: ["ADMIN"],
  reverseMovementAction: ["PRODUCTION"],
  voidLabResultAction: ["PRODUCTION"],
  setOwnUnitsAction: ANY,
  changeOwnPasswordAction: ANY,
  openContainerAction: ["PRODUCTION", "COMPLIANCE"],
  recordCharacterisationAction: ["PRODUCTION", "COMPLIANCE"],
  markFullAction: ["PRODUCTION", "COMPLIANCE"],
  recordHaulAction: ["COMPLIANCE"],
  chooseWasteRulesAction: ["COMPLIANCE", "ADMIN"],
  setClosureToleranceAction: ["COMPLIANCE", "ADMIN"],
  setWaterLimitsAction: ["COMPLIANCE", "ADMIN"],
  createCustomerAction: ["COMPLIANCE"],
  changeCustomerAction: ["COMPLIANCE"],
  recordShipmentAction: ["COMPLIANCE"],
  saveSiteSpecAction: ["COMPLIANCE"],
  decideFlagAction: ["COMPLIANCE"],
  screenPeriodAction: ["COMPLIANCE"],
  changeThresholdAction: ["COMPLIANCE", "ADMIN"],
  saveSourceProfileAction: ["COMPLIANCE"],
  clearSourceAction: ["COMPLIANCE"],
  recordQcResultAction: ["PRODUCTION", "COMPLIANCE"],
  chooseProductSpecAction: ["COMPLIANCE"],
  decideProductLotAction: ["COMPLIANCE"],
  holdRecalledAction: ["COMPLIANCE"],
};

interface ActionEntry {
  id: string;
  name: string;
  page: string;
}

/** Server actions of the production build, read from Next's server-reference manifest: id, export name, one page that serves it. */
function builtActions(): ActionEntry[] {
  const dist = path.resolve(import.meta.dirname, "..", process.env.NEXT_DIST_DIR ?? ".next");
  const manifest = JSON.parse(readFileSync(path.join(dist, "server", "server-reference-manifest.json"), "utf8")) as {
    node: Record<string, { exportedName: string; workers: Record<string, unknown> }>;
  };
  return Object.entries(manifest.node).map(([id, entry]) => {
    const worker = Object.keys(entry.workers).find((w) => !w.includes("_not-found")) ?? "app/page";
    const page = `/${worker.replace(/^app\//, "").replace(/\/?page$/, "")}`.replace(/\[[^\]]+\]/g, "NO-SUCH-RECORD");
    return { id, name: entry.exportedName, page };
  });
}

// The same rule for server actions: each is posted directly (the wire format a browser form uses — a
// Next-Action header and a React reply-encoded multipart body), as each role and anonymously. A refused
// call answers with the server's refusal text; an allowed one gets past the role check to the input checks.
test("every server action refuses anonymous callers and the roles it does not allow", async ({ baseURL }) => {
  const actions = builtActions();
  expect(actions.length).toBeGreaterThan(5);
  const missing = actions.filter((a) => !(a.name in ACTIONS)).map((a) => a.name);
  expect(missing, "add these server actions to the authorisation matrix").toEqual([]);
  // Without any cookie the proxy only redirects to sign-in; a forged session cookie gets past that
  // optimistic check, so the action's own server-side check is what must refuse it.
  const anonymous = await playwrightRequest.newContext({
    baseURL,
    extraHTTPHeaders: { cookie: "tv_session=forged-or-expired-token" },
  });
  const asRole = await signedInAsEachRole(baseURL);
  const prev = { status: "idle", ok: false, message: null, field: null, reason: "", values: {}, errors: {}, seq: 0 };
  const call = async (ctx: APIRequestContext, a: ActionEntry) => {
    const res = await ctx.post(a.page, {
      headers: { "next-action": a.id, origin: baseURL!, accept: "text/x-component" },
      multipart: { "0": JSON.stringify([prev, "$K1"]), "1_periodId": "999999", "1_lotCode": "NO-SUCH-RECORD" },
    });
    return { status: res.status(), text: await res.text() };
  };
  const SIGNED_OUT = "Sign in first";
  const FORBIDDEN = "This needs one of these roles";
  const failures: string[] = [];
  let checked = 0;
  for (const a of actions) {
    const allowed = ACTIONS[a.name];
    if (allowed === "public" || allowed === undefined) continue;
    checked += 1;
    const anon = await call(anonymous, a);
    if (!anon.text.includes(SIGNED_OUT)) failures.push(`${a.name} anonymous → ${anon.status}, no sign-in refusal`);
    for (const role of ANY) {
      const r = await call(asRole.get(role)!, a);
      const ok = allowed.includes(role);
      if (r.status >= 500) failures.push(`${a.name} as ${role} → ${r.status}`);
      if (ok && (r.text.includes(FORBIDDEN) || r.text.includes(SIGNED_OUT)))
        failures.push(`${a.name} as ${role} → refused, expected to be let through`);
      if (!ok && !r.text.includes(FORBIDDEN)) failures.push(`${a.name} as ${role} → ${r.status}, no role refusal`);
    }
  }
  expect(checked).toBeGreaterThan(5);
  expect(failures).toEqual([]);
});
