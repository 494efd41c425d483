// Measuring one run: autocannon against a server with a mix of requests, per-route latencies taken from
// each response, bookings refused for a domain reason counted apart from errors, and the server's peak
// resident memory over the run.
import { randomUUID } from "node:crypto";
import autocannon from "autocannon";
import type { AppServer } from "@/bench/load-server";
import { DEMO_PASSWORD } from "@/bench/load-mix";
import type { MixRequest } from "@/bench/load-mix";

export interface RouteStats {
  count: number;
  errors: number;
  /** Error answers by status: which failure it was (a 503 is the database, a 500 a fault, a 4xx a refusal). */
  statuses: Map<number, number>;
  refused: number;
  latencies: number[];
}

export interface RunResult {
  section: string;
  connections: number;
  rps: number;
  p50: number;
  p95: number;
  p99: number;
  errors: number;
  refused: number;
  /** Requests with no answer within autocannon's timeout, counted apart from answers that were errors. */
  timeouts: number;
  socketErrors: number;
  routes: Map<string, RouteStats>;
  peakMb: number;
  durationS: number;
}

/** How long a request may go unanswered before it counts as a timeout. */
export const TIMEOUT_S = 30;

export function pct(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] ?? Number.NaN;
}

/** fetch, sent once more if the connection drops before an answer (a kept-alive socket the server closed meanwhile). */
export async function fetchOnce(url: string, init?: RequestInit): Promise<Response> {
  try {
    return await fetch(url, init);
  } catch {
    await new Promise((r) => setTimeout(r, 500));
    return fetch(url, init);
  }
}

export async function signIn(base: string, login: string): Promise<string> {
  const r = await fetchOnce(`${base}/api/session`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: base },
    body: JSON.stringify({ login, password: DEMO_PASSWORD }),
  });
  const cookie = r.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .find((c) => c?.includes("tv_session="));
  if (!r.ok || cookie === undefined) throw new Error(`sign-in as ${login} refused: ${r.status} ${await r.text()}`);
  return cookie;
}

/**
 * The mix as autocannon request slots. Every connection walks the mix in order, so each round starts at
 * the next offset (a shared counter): over a short run each route gets its share instead of the first
 * entries getting most. The route being answered is kept in the connection's context for the timings.
 */
export function toAutocannon(
  mix: readonly MixRequest[],
  base: string,
  cookies: Record<MixRequest["as"], string>,
  routes: Map<string, RouteStats>,
): autocannon.Request[] {
  let rounds = 0;
  const pick = (slot: number, context: Record<string, unknown>): MixRequest | undefined => {
    const offset = typeof context.offset === "number" ? context.offset : rounds++ % mix.length;
    context.offset = offset;
    return mix[(offset + slot) % mix.length];
  };
  return mix.map((_, slot): autocannon.Request => ({
    method: "GET",
    path: "/",
    setupRequest: (r: autocannon.Request, ctx: object): autocannon.Request => {
      const context = ctx as Record<string, unknown>;
      const m = pick(slot, context);
      if (m === undefined) return r;
      context.route = m.route;
      const headers: Record<string, string> = {
        cookie: cookies[m.as],
        accept: m.kind === "page" ? "text/html" : "application/json",
      };
      if (m.method === "POST")
        Object.assign(headers, { "content-type": "application/json", origin: base, "idempotency-key": randomUUID() });
      return { ...r, method: m.method, path: m.path, headers, ...(m.body ? { body: m.body() } : {}) };
    },
    onResponse: (status: number, text: string, ctx: object) => {
      const context = ctx as Record<string, unknown>;
      const route = typeof context.route === "string" ? context.route : "";
      const s = routes.get(route);
      if (!route.startsWith("write") || s === undefined || status < 400 || status >= 500) return;
      // A refused booking (a domain code such as an over-draw) is counted apart; a refused sign-in or key is an error.
      if (/"code":"(AUTH|IDEMPOTENCY)\./.test(text)) s.errors += 1;
      else s.refused += 1;
    },
  }));
}

/** What the errors were: "none", or e.g. "3 (503 ×2, no answer in 30 s ×1)". */
export function describeErrors(r: RunResult): string {
  if (r.errors === 0) return "0";
  const byStatus = new Map<number, number>();
  for (const s of r.routes.values())
    for (const [status, n] of s.statuses) byStatus.set(status, (byStatus.get(status) ?? 0) + n);
  const parts = [...byStatus].sort(([a], [b]) => a - b).map(([status, n]) => `${status} ×${n}`);
  if (r.timeouts > 0) parts.push(`no answer in ${TIMEOUT_S} s ×${r.timeouts}`);
  if (r.socketErrors > 0) parts.push(`connection failed ×${r.socketErrors}`);
  return `${r.errors} (${parts.join(", ")})`;
}

export async function measure(
  section: string,
  server: AppServer,
  mix: readonly MixRequest[],
  cookies: Record<MixRequest["as"], string>,
  connections: number,
  durationS: number,
): Promise<RunResult> {
  const routes = new Map<string, RouteStats>(
    mix.map((m) => [m.route, { count: 0, errors: 0, statuses: new Map<number, number>(), refused: 0, latencies: [] }]),
  );
  const all: number[] = [];
  server.takePeakMb();
  let instance: autocannon.Instance | undefined;
  const finished = new Promise<autocannon.Result>((resolve, reject) => {
    instance = autocannon(
      {
        url: server.base,
        connections,
        duration: durationS,
        requests: toAutocannon(mix, server.base, cookies, routes),
        timeout: TIMEOUT_S,
      },
      (err: unknown, res: autocannon.Result) =>
        err ? reject(err instanceof Error ? err : new Error(JSON.stringify(err))) : resolve(res),
    );
  });
  if (instance === undefined) throw new Error("autocannon did not start");
  instance.on("response", (client: unknown, status: number, _bytes: number, ms: number) => {
    const context = (client as { requestIterator?: { context?: Record<string, unknown> } }).requestIterator?.context;
    const route = typeof context?.route === "string" ? context.route : "?";
    const s = routes.get(route);
    all.push(ms);
    if (s === undefined) return;
    s.count += 1;
    s.latencies.push(ms);
    if (status >= 500 || (!route.startsWith("write") && status >= 400)) {
      s.errors += 1;
      s.statuses.set(status, (s.statuses.get(status) ?? 0) + 1);
    }
  });
  const result = await finished;
  all.sort((a, b) => a - b);
  for (const s of routes.values()) s.latencies.sort((a, b) => a - b);
  const errors = [...routes.values()].reduce((n, s) => n + s.errors, 0);
  const refused = [...routes.values()].reduce((n, s) => n + s.refused, 0);
  return {
    section,
    connections,
    rps: all.length / durationS,
    p50: pct(all, 50),
    p95: pct(all, 95),
    p99: pct(all, 99),
    errors: errors + result.errors + result.timeouts,
    refused,
    timeouts: result.timeouts,
    socketErrors: result.errors,
    routes,
    peakMb: server.takePeakMb(),
    durationS,
  };
}
