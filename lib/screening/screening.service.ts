import "server-only";
// Runs the screening signals: cheaply for the sources behind one new pickup, lot or lab result, or for
// every source over a period chosen from the queue page. Flags are saved; decisions never reopen.
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db } from "@/lib/core/connect";
import { ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import { runInTransaction, withoutIdempotencyKey } from "@/lib/ledger/transaction.store";
import { parseInput } from "@/lib/ledger/parse";
import { log } from "@/lib/log/log.service";
import type { CapacityBasis } from "@/lib/screening/capacity";
import { monthlyVolumes } from "@/lib/screening/screening";
import type { Flag, LotFact, PickupFact, SourceFacts } from "@/lib/screening/screening";
import { getScreeningSettings } from "@/lib/screening/screening-settings.service";
import type { ScreeningSettings } from "@/lib/screening/screening-defaults";
import { ScreenPeriodSchema } from "@/lib/screening/screening.schema";
import {
  findSourceIdsOf,
  listScreenLots,
  listScreenPickups,
  listScreenSources,
  saveFlags,
} from "@/lib/screening/screening.store";
import type { LotScreenRow, PickupScreenRow, SourceScreenRow } from "@/lib/screening/screening.store";
import { indexKindMonths, peersOf, screenSource } from "@/lib/screening/screen-source";
import { getSiteById } from "@/lib/site/site.store";
import type { Actor } from "@/lib/core/actor";

/** How far back a screen triggered by one record looks. */
export const TRIGGERED_WINDOW_MONTHS = 24;

export interface ScreenOutcome {
  sources: number;
  pickups: number;
  lots: number;
  raised: number;
  created: number;
  computeMs: number;
}

function localClock(timeZone: string): (d: Date) => { month: string; monthLabel: string; hour: number } {
  const parts = new Intl.DateTimeFormat("en-GB", {
    timeZone,
    year: "numeric",
    month: "2-digit",
    hour: "2-digit",
    minute: "2-digit",
    hourCycle: "h23",
  });
  const names = new Intl.DateTimeFormat("en-GB", { timeZone: "UTC", year: "numeric", month: "long" });
  const labels = new Map<string, string>();
  return (d) => {
    const p = Object.fromEntries(parts.formatToParts(d).map((x) => [x.type, x.value]));
    const month = `${p.year}-${p.month}`;
    let label = labels.get(month);
    if (label === undefined) {
      label = names.format(new Date(Date.UTC(Number(p.year), Number(p.month) - 1, 15)));
      labels.set(month, label);
    }
    return { month, monthLabel: label, hour: Number(p.hour) + Number(p.minute) / 60 };
  };
}

function toFacts(
  s: SourceScreenRow,
  pickups: readonly PickupScreenRow[],
  lots: readonly LotScreenRow[],
  clock: ReturnType<typeof localClock>,
): SourceFacts {
  const expires = s.certificateExpires?.getTime() ?? null;
  const pickupFacts: PickupFact[] = pickups.map((p) => {
    const c = clock(p.observedAt);
    const at = p.observedAt.getTime();
    const certified =
      p.lot !== null && p.lot.certified && s.certificateNo !== null && (expires === null || at < expires);
    return {
      code: p.code,
      at,
      month: c.month,
      monthLabel: c.monthLabel,
      localHour: c.hour,
      litres: p.volumeMl / 1000,
      lotCode: p.lot?.code ?? null,
      distanceBand: p.phoneDistanceBand,
      certified,
    };
  });
  const lotFacts: LotFact[] = lots.map((l) => ({
    code: l.code,
    at: l.receivedAt.getTime(),
    material: l.material,
    acidValue: l.acidValue,
    waterPct: l.waterPct,
    insolublesPct: l.insolublesPct,
    densityKgM3: l.densityKgM3,
    densityMeasured: !l.densitySource.startsWith("table"),
  }));
  const capacity =
    s.capacityBasis === null
      ? null
      : {
          basis: s.capacityBasis as CapacityBasis,
          fryers: s.fryers,
          fryerLitres: s.fryerLitres,
          changesPerWeek: s.changesPerWeek,
          declaredLitresPerMonth: s.declaredLitresPerMonth,
        };
  return {
    code: s.code,
    kind: s.kind,
    capacity,
    opensHour: s.opensHour,
    closesHour: s.closesHour,
    certificateNo: s.certificateNo,
    certificateExpires: expires,
    pickups: pickupFacts,
    lots: lotFacts,
  };
}

/** Screens the given sources (null: all) over [from, to); peers are the other sources of each kind. */
export async function runScreen(
  db: Db,
  actor: Actor,
  sourceIds: readonly number[] | null,
  from: Date,
  to: Date,
  siteSettings?: ScreeningSettings,
): Promise<ScreenOutcome> {
  const started = performance.now();
  const settings = siteSettings ?? (await getScreeningSettings(db, actor.siteId));
  const site = await getSiteById(db, actor.siteId);
  const clock = localClock(site?.timeZone ?? "UTC");
  const sources = await listScreenSources(db, actor.siteId);
  const wanted = sourceIds === null ? sources : sources.filter((s) => sourceIds.includes(s.id));
  const kinds = new Set(wanted.map((s) => s.kind));
  const loadIds = sourceIds === null ? null : sources.filter((s) => kinds.has(s.kind)).map((s) => s.id);
  const [pickups, lots] = await Promise.all([
    listScreenPickups(db, actor.siteId, loadIds, from, to),
    listScreenLots(db, actor.siteId, from, to),
  ]);
  const pickupsBy = groupBy(pickups, (p) => [p.sourceId]);
  const lotsBy = groupBy(lots, (l) => [
    ...new Set([...(l.supplierId === null ? [] : [l.supplierId]), ...l.mainSourceIds]),
  ]);
  const facts = new Map(
    sources
      .filter((s) => loadIds === null || loadIds.includes(s.id))
      .map((s) => [s.id, toFacts(s, pickupsBy.get(s.id) ?? [], lotsBy.get(s.id) ?? [], clock)]),
  );
  const index = indexKindMonths(
    [...facts.values()].map((f) => ({ code: f.code, kind: f.kind, months: monthlyVolumes(f.pickups) })),
  );
  const raised: Array<{ sourceId: number; flag: Flag }> = [];
  for (const s of wanted) {
    const f = facts.get(s.id);
    if (f === undefined) continue;
    for (const flag of screenSource(f, {
      settings,
      now: actor.now.getTime(),
      peerLitres: peersOf(index, s.kind, s.code),
      kindLabel: labelOf(s.kind),
    }))
      raised.push({ sourceId: s.id, flag });
  }
  const created = await runInTransaction(db, (tx) => saveFlags(tx, actor.siteId, raised, actor.now));
  if (!created.ok) throw new Error(created.issues.map((i) => i.message).join("; "));
  return {
    sources: wanted.length,
    pickups: pickups.length,
    lots: lots.length,
    raised: raised.length,
    created: created.value,
    computeMs: Math.round(performance.now() - started),
  };
}

function groupBy<T>(rows: readonly T[], keys: (row: T) => number[]): Map<number, T[]> {
  const out = new Map<number, T[]>();
  for (const r of rows) for (const k of keys(r)) out.set(k, [...(out.get(k) ?? []), r]);
  return out;
}

/** Screening every source over a chosen period, from the queue page. The run itself is audited. */
export async function screenPeriod(db: Db, actor: Actor, input: unknown): Promise<Result<ScreenOutcome>> {
  const parsed = parseInput(ScreenPeriodSchema, input);
  if (!parsed.ok) return parsed;
  const outcome = await runScreen(db, actor, null, parsed.value.from, parsed.value.to);
  const audited = await runInTransaction(db, (tx) =>
    appendAudit(tx, actor, {
      action: "CREATE",
      entity: "Screening",
      entityKey: `${parsed.value.from.toISOString()}/${parsed.value.to.toISOString()}`,
      after: outcome,
    }),
  );
  if (!audited.ok) return audited;
  return ok(outcome);
}

/**
 * After a pickup, lot or lab result is recorded: screen only the sources behind it, over the last
 * TRIGGERED_WINDOW_MONTHS. A failure here is logged and never undoes the record already saved.
 */
export async function screenAfterRecord(
  db: Db,
  actor: Actor,
  subject: { pickupCodes?: readonly string[]; lotCodes?: readonly string[] },
): Promise<void> {
  try {
    const ids = await findSourceIdsOf(db, actor.siteId, subject.pickupCodes ?? [], subject.lotCodes ?? []);
    if (ids.length === 0) return;
    const from = new Date(actor.now);
    from.setUTCMonth(from.getUTCMonth() - TRIGGERED_WINDOW_MONTHS);
    await runScreen(db, actor, ids, from, new Date(actor.now.getTime() + 86_400_000));
  } catch (error) {
    log.warn(
      { event: "screening.after-record", err: error, subject },
      "screening after a record failed; the record itself is saved",
    );
  }
}

/** A service followed by the cheap screen of what it recorded, for routes and actions. */
export function thenScreen<T>(
  service: (db: Db, actor: Actor, input: unknown) => Promise<Result<T>>,
  subject: (value: T, input: unknown) => { pickupCodes?: string[]; lotCodes?: string[] },
): (db: Db, actor: Actor, input: unknown) => Promise<Result<T>> {
  return async (db, actor, input) => {
    const result = await service(db, actor, input);
    // The screen is its own write: outside the request's idempotency key, which the record already stored
    // (under it, the screen's transaction would be answered as a replay of the record and never commit).
    if (result.ok) await withoutIdempotencyKey(() => screenAfterRecord(db, actor, subject(result.value, input)));
    return result;
  };
}
