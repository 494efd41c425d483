// Two server processes on one PostgreSQL database: bookings go to one, traces and balances to the other,
// at the same time. Then, with the books still, every read answer (and its ETag, which names the ledger
// position) must be the same from both; a session opened on one must work on the other; and a booking
// resent to the other process under the same idempotency key must be answered once, not booked twice.
import { randomUUID } from "node:crypto";
import type { AppServer } from "@/bench/load-server";
import { readMix, READER_LOGIN, WRITER_LOGIN, writeMix } from "@/bench/load-mix";
import type { DemoCodes, MixRequest } from "@/bench/load-mix";
import { describeErrors, measure, signIn } from "@/bench/load-measure";

/** An answer without what legitimately differs between processes: timings and when this process indexed the ledger. */
function comparable(text: string): string {
  return JSON.stringify(
    JSON.parse(text, (key: string, value: unknown) => (key === "computeMs" || key === "freshness" ? undefined : value)),
  );
}

async function sameAnswer(a: AppServer, b: AppServer, path: string, cookie: string): Promise<string | null> {
  const [ra, rb] = await Promise.all([
    fetch(`${a.base}${path}`, { headers: { cookie } }),
    fetch(`${b.base}${path}`, { headers: { cookie } }),
  ]);
  const [ta, tb] = [await ra.text(), await rb.text()];
  if (ra.status !== 200 || rb.status !== 200) return `${path}: status ${ra.status} / ${rb.status}`;
  if (ra.headers.get("etag") !== rb.headers.get("etag"))
    return `${path}: ETag ${ra.headers.get("etag")} / ${rb.headers.get("etag")}`;
  return comparable(ta) === comparable(tb) ? null : `${path}: answers differ`;
}

async function resendAcross(a: AppServer, b: AppServer, cookie: string, codes: DemoCodes): Promise<string | null> {
  const key = randomUUID();
  const body = JSON.stringify({
    code: `LD2-${Date.now().toString(36)}`.toUpperCase(),
    sourceCode: codes.source,
    material: codes.material,
    observedAt: new Date(Date.now() - 3_600_000).toISOString(),
    containers: 1,
    volumeL: 50,
    tempC: 20,
  });
  const send = (s: AppServer) =>
    fetch(`${s.base}/api/pickups`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: s.base, cookie, "idempotency-key": key },
      body,
    });
  const first = await send(a);
  const again = await send(b);
  const [t1, t2] = [await first.text(), await again.text()];
  if (!first.ok) return `first booking refused: ${first.status} ${t1}`;
  return again.status === first.status && t1 === t2
    ? null
    : `resent booking answered ${again.status} ${t2.slice(0, 120)} (first: ${t1.slice(0, 120)})`;
}

/** Runs the two-process load and the checks; returns printable lines. */
export async function compareServers(
  a: AppServer,
  b: AppServer,
  codes: DemoCodes,
  durationS: number,
  reads: readonly MixRequest[] = readMix(codes),
): Promise<string[]> {
  const writer = await signIn(a.base, WRITER_LOGIN);
  const reader = await signIn(a.base, READER_LOGIN);
  const cookies = { reader, writer };
  const writes = writeMix(codes, reads).filter((m) => m.kind === "write");
  // The second process gets the same untimed round the first one had before its runs (its first trace
  // builds the site's index from the stored chunks), so the timed run compares two warm processes.
  await measure("two processes: warm-up", b, reads, cookies, 1, 3).catch(() => undefined);
  const [w, r] = await Promise.all([
    measure("two processes: bookings", a, writes, cookies, 5, durationS),
    measure("two processes: reads", b, reads, cookies, 45, durationS),
  ]);
  const lines = [
    `bookings to one process: ${w.rps.toFixed(1)} req/s, p95 ${w.p95.toFixed(0)} ms, errors ${describeErrors(w)}, refused ${w.refused}; reads from the other: ${r.rps.toFixed(1)} req/s, p95 ${r.p95.toFixed(0)} ms, errors ${describeErrors(r)}; together ${(w.rps + r.rps).toFixed(1)} req/s (${durationS} s)`,
  ];
  const problems: string[] = [];
  const session = await fetch(`${b.base}/api/me`, { headers: { cookie: reader } });
  if (!session.ok) problems.push(`a session opened on one process was refused by the other: ${session.status}`);
  for (const m of reads.filter((x) => x.kind === "json")) {
    const p = await sameAnswer(a, b, m.path, reader);
    if (p !== null) problems.push(p);
  }
  const resend = await resendAcross(a, b, writer, codes);
  if (resend !== null) problems.push(resend);
  lines.push(
    problems.length === 0
      ? "after the run: every JSON answer and its ETag the same from both processes; a session and an idempotency key honoured across them"
      : `MISMATCH: ${problems.join("; ")}`,
  );
  return lines;
}
