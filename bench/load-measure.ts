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
  socketErrors: number;
  routes: Map<string, RouteStats>;
  peakMb: number;
  durationS: number;
}

export function pct(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] ?? Number.NaN;
}

export async function signIn(base: string, login: string): Promise<string> {
  const r = await fetch(`${base}/api/session`, { method: "POST", headers: { "content-type": "application/json", origin: base }, body: JSON.stringify({ login, password: DEMO_PASSWORD }) });
  const cookie = r.headers.getSetCookie().map((c) => c.split(";")[0]).find((c) => c?.includes("tv_session="));
  if (!r.ok || cookie === undefined) throw new Error(`sign-in as ${login} refused: ${r.status} ${await r.text()}`);
  return cookie;
}

export function toAutocannon(mix: readonly MixRequest[], base: string, cookies: Record<MixRequest["as"], string>, routes: Map<string, RouteStats>): autocannon.Request[] {
  return mix.map((m) => {
    const headers: Record<string, string> = { cookie: cookies[m.as], accept: m.kind === "page" ? "text/html" : "application/json" };
    if (m.method === "POST") Object.assign(headers, { "content-type": "application/json", origin: base });
    const req: autocannon.Request & { route: string } = { route: m.route, method: m.method, path: m.path, headers };
    if (m.body !== undefined) {
      const body = m.body;
      req.setupRequest = (r) => ({ ...r, body: body(), headers: { ...headers, "idempotency-key": randomUUID() } });
      req.onResponse = (status: number, text: string) => {
        const s = routes.get(m.route);
        if (s === undefined || status < 400 || status >= 500) return;
        // A refused booking (a domain code such as an over-draw) is counted apart; a refused sign-in or key is an error.
        if (/"code":"(AUTH|IDEMPOTENCY)\./.test(text)) s.errors += 1;
        else s.refused += 1;
      };
    }
    return req;
  });
}

export async function measure(section: string, server: AppServer, mix: readonly MixRequest[], cookies: Record<MixRequest["as"], string>, connections: number, durationS: number): Promise<RunResult> {
  const routes = new Map<string, RouteStats>(mix.map((m) => [m.route, { count: 0, errors: 0, refused: 0, latencies: [] }]));
  const all: number[] = [];
  server.takePeakMb();
  let instance: autocannon.Instance | undefined;
  const finished = new Promise<autocannon.Result>((resolve, reject) => {
    instance = autocannon({ url: server.base, connections, duration: durationS, requests: toAutocannon(mix, server.base, cookies, routes), timeout: 30 }, (err: unknown, res: autocannon.Result) => (err ? reject(err instanceof Error ? err : new Error(String(err))) : resolve(res)));
  });
  if (instance === undefined) throw new Error("autocannon did not start");
  instance.on("response", (client: unknown, status: number, _bytes: number, ms: number) => {
    const route = (client as { requestIterator?: { currentRequest?: { route?: string } } }).requestIterator?.currentRequest?.route ?? "?";
    const s = routes.get(route);
    all.push(ms);
    if (s === undefined) return;
    s.count += 1;
    s.latencies.push(ms);
    if (status >= 500 || (!route.startsWith("write") && status >= 400)) s.errors += 1;
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
    socketErrors: result.errors + result.timeouts,
    routes,
    peakMb: server.takePeakMb(),
    durationS,
  };
}

