import "server-only";
import type { Db } from "@/lib/core/connect";
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { parseInput } from "@/lib/ledger/parse";
import { getBalanceReport } from "@/lib/mass-balance/balance.service";
import { getUtcOffsetMin } from "@/lib/period/site-time";
import type { SiteRow } from "@/lib/site/site.store";
import { traceBackwardReport, traceForwardReport } from "@/lib/trace/trace.service";
import { buildEpcisDocument } from "@/lib/epcis/epcis";
import type { EpcisDocument } from "@/lib/epcis/epcis";
import { EpcisTraceQuerySchema } from "@/lib/epcis/epcis.schema";
import { identifierScheme } from "@/lib/epcis/identifiers";
import { loadEpcisLedger } from "@/lib/epcis/epcis.store";
import { backwardScope } from "@/lib/epcis/scope";

export interface EpcisExport {
  document: EpcisDocument;
  /** A file name for the download, e.g. "epcis-2026-11.json". */
  fileName: string;
}

export interface EpcisOptions {
  /** The server's web address, the root of the site's own identifiers. */
  baseUri: string;
  /** Shipments name their customer only for readers who may see customers. */
  withCustomers: boolean;
}

function fileSafe(text: string): string {
  return text.replace(/[^A-Za-z0-9._-]+/g, "_");
}

function common(site: SiteRow, opts: EpcisOptions, now: Date) {
  const ids = identifierScheme({ gs1CompanyPrefix: site.gs1CompanyPrefix, baseUri: opts.baseUri, siteCode: site.code });
  const eventBase = `${opts.baseUri.replace(/\/+$/, "")}/id/${encodeURIComponent(site.code)}/event`;
  return {
    ids,
    eventBase,
    offsetMin: (atMs: number) => getUtcOffsetMin(site.timeZone, new Date(atMs)),
    createdAt: now,
  };
}

/** The events of a balance period (the same query and period as the balance page). */
export async function epcisForPeriod(
  db: Db,
  site: SiteRow,
  input: unknown,
  now: Date,
  opts: EpcisOptions,
): Promise<Result<EpcisExport>> {
  const balance = await getBalanceReport(db, site, input, now);
  if (!balance.ok) return balance;
  const { period } = balance.value;
  const ledger = await loadEpcisLedger(db, site.id, { withCustomers: opts.withCustomers });
  const document = buildEpcisDocument({
    ...ledger,
    ...common(site, opts, now),
    period: { startMs: period.startsAt.getTime(), endMs: period.endsAt.getTime() },
  });
  return ok({ document, fileName: `epcis-${fileSafe(site.code)}-${fileSafe(period.label)}.json` });
}

/** The events behind one trace answer: the movements between the holders the answer covers. */
export async function epcisForTrace(
  db: Db,
  site: SiteRow,
  input: unknown,
  now: Date,
  opts: EpcisOptions,
): Promise<Result<EpcisExport>> {
  const parsed = parseInput(EpcisTraceQuerySchema, input);
  if (!parsed.ok) return parsed;
  const q = parsed.value;
  const ledger = await loadEpcisLedger(db, site.id, { withCustomers: opts.withCustomers });
  let scope: Set<number>;
  if (q.dir === "back") {
    const back = await traceBackwardReport(db, site.id, { kind: q.kind, code: q.code, at: q.at }, now);
    if (!back.ok) return back;
    const entries = back.value.origins.flatMap((o) => (o.entryHolder ? [o.entryHolder.id] : []));
    scope = backwardScope(ledger.moves, back.value.target.id, entries);
  } else {
    const fwd = await traceForwardReport(db, site.id, { kind: q.kind, code: q.code }, now, {
      withCustomers: opts.withCustomers,
    });
    if (!fwd.ok) return fwd;
    scope = new Set(fwd.value.holders.map((h) => h.holder.id));
  }
  const document = buildEpcisDocument({ ...ledger, ...common(site, opts, now), scope });
  return ok({
    document,
    fileName: `epcis-${fileSafe(site.code)}-${q.dir === "back" ? "in" : "from"}-${fileSafe(q.code)}.json`,
  });
}
