import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { request as playwrightRequest } from "@playwright/test";
import { expect, test } from "./support/test";
import type { APIRequestContext } from "@playwright/test";

// OWASP ASVS 5.0 V4.1 / V13: a server bounds what it reads. Every JSON write route and every server
// action refuses an oversized body with 413 and a message naming the limit — never a 500.
const LOGINS = ["production.tess", "compliance.nell", "admin.jory", "collector.ivo"];
const MB = 1_000_000;
/** Routes that read more than the 1 MB default, with their own limit (imports and pasted blocks). */
const BULK: Record<string, number> = {
  "/api/pickups/import": 5 * MB,
  "/api/grid/save": 5 * MB,
  "/api/grid/import": 2 * 10 * 1024 * 1024 + MB,
};

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

const jsonOf = (bytes: number) => JSON.stringify({ note: "x".repeat(bytes) });

async function contexts(baseURL: string | undefined): Promise<APIRequestContext[]> {
  const out: APIRequestContext[] = [];
  for (const login of LOGINS) {
    const ctx = await playwrightRequest.newContext({ baseURL });
    expect((await ctx.post("/api/session", { data: { login, password: "quillmoor-demo" } })).status()).toBe(200);
    out.push(ctx);
  }
  return out;
}

test("every JSON write route refuses 2 MB and 10 MB bodies over its limit with 413 and the limit named", async ({
  baseURL,
}) => {
  test.setTimeout(300_000);
  const routes = postRoutes(path.resolve(import.meta.dirname, "..", "app", "api")).filter((r) => !r.includes("["));
  expect(routes.length).toBeGreaterThan(15);
  const roles = await contexts(baseURL);
  const failures: string[] = [];
  let refused = 0;
  for (const route of routes) {
    const limit = BULK[route] ?? MB;
    for (const size of [2 * MB, 10 * MB, ...(limit >= 10 * MB ? [limit + MB] : [])]) {
      // The first role the route lets through (the body is read only after the role check).
      let answered = false;
      for (const ctx of roles) {
        const res = await ctx.post(route, {
          headers: {
            "content-type": "application/json",
            origin: baseURL!,
            "idempotency-key": `size-${size}-${route.replace(/\W/g, "")}`,
          },
          data: jsonOf(size),
        });
        if (res.status() === 403) continue;
        answered = true;
        const text = await res.text();
        if (res.status() >= 500) failures.push(`${route} ${size} B → ${res.status()}`);
        else if (size > limit) {
          refused += 1;
          if (res.status() !== 413 || !/The request is larger than \d/.test(text))
            failures.push(`${route} ${size} B → ${res.status()} ${text.slice(0, 120)}`);
        } else if (res.status() === 413) failures.push(`${route} ${size} B refused under its ${limit} B limit`);
        break;
      }
      if (!answered) failures.push(`${route}: no role let through`);
    }
  }
  expect(refused).toBeGreaterThan(30);
  expect(failures).toEqual([]);
});

test("a server action posted with 2 MB or 10 MB is refused with 413 and the limit named", async ({ baseURL }) => {
  const dist = path.resolve(import.meta.dirname, "..", process.env.NEXT_DIST_DIR ?? ".next");
  const manifest = JSON.parse(readFileSync(path.join(dist, "server", "server-reference-manifest.json"), "utf8")) as {
    node: Record<string, { exportedName: string; workers: Record<string, unknown> }>;
  };
  const actions = Object.entries(manifest.node);
  expect(actions.length).toBeGreaterThan(5);
  const [ctx] = await contexts(baseURL);
  const failures: string[] = [];
  for (const [id, entry] of actions) {
    const worker = Object.keys(entry.workers).find((w) => !w.includes("_not-found")) ?? "app/page";
    const page = `/${worker.replace(/^app\//, "").replace(/\/?page$/, "")}`.replace(/\[[^\]]+\]/g, "NO-SUCH-RECORD");
    for (const size of [2 * MB, 10 * MB]) {
      const res = await ctx!.post(page, {
        headers: { "next-action": id, origin: baseURL!, accept: "text/x-component" },
        multipart: { "0": JSON.stringify(["$K1"]), "1_reason": "x".repeat(size) },
      });
      const text = await res.text();
      if (res.status() !== 413 || text !== "The request is larger than 1 MB")
        failures.push(`${entry.exportedName} ${size} B → ${res.status()} ${text.slice(0, 80)}`);
    }
  }
  expect(failures).toEqual([]);
});
