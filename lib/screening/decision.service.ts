import "server-only";
// Compliance's side of screening: a source's declared capacity and hours, decisions on flags (confirm
// with watch, lot hold and withheld credit, or dismiss with a reason), and clearing a source. All audited.
import { appendAudit } from "@/lib/audit/audit.store";
import type { Db, Tx } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { setLotScreeningHold } from "@/lib/feedstock/lot.store";
import { reject, runInTransaction } from "@/lib/ledger/transaction.store";
import { parseInput } from "@/lib/ledger/parse";
import { ClearSourceSchema, FlagDecisionSchema, SourceProfileSchema } from "@/lib/screening/screening.schema";
import {
  listConfirmedFlagsOf,
  listOnSiteLotsOf,
  requireFlag,
  setFlagDecision,
  setSourceStanding,
} from "@/lib/screening/screening.store";
import { getSourceProfile, updateSourceProfile } from "@/lib/screening/source-profile.store";
import type { Actor } from "@/lib/core/actor";

export async function saveSourceProfile(db: Db, actor: Actor, input: unknown): Promise<Result<{ code: string }>> {
  const parsed = parseInput(SourceProfileSchema, input);
  if (!parsed.ok) return parsed;
  const p = parsed.value;
  return runInTransaction(db, async (tx) => {
    const before = await getSourceProfile(tx, actor.siteId, p.sourceCode);
    if (before === null) reject("RECORD.NOT_FOUND", `Source ${p.sourceCode} does not exist`, "sourceCode");
    await updateSourceProfile(tx, before.id, p);
    const { id: _id, ...shown } = before;
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "Source",
      entityKey: p.sourceCode,
      before: shown,
      after: p,
    });
    return { code: p.sourceCode };
  });
}

export interface DecisionOutcome {
  flagId: number;
  status: string;
  heldLots: string[];
  watch: boolean;
  creditWithheld: boolean;
}

/** Puts every lot of the source still on site on hold (already held ones are left as they are); their codes. */
async function holdLotsOf(tx: Tx, actor: Actor, sourceId: number, flagId: number): Promise<string[]> {
  const held: string[] = [];
  for (const lot of await listOnSiteLotsOf(tx, actor.siteId, sourceId)) {
    if (lot.screeningHold) continue;
    await setLotScreeningHold(tx, lot.id, true);
    held.push(lot.code);
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "FeedstockLot",
      entityKey: lot.code,
      before: { status: lot.status, screeningHold: false },
      after: { status: "QUARANTINED", screeningHold: true },
      reason: `held by source check flag ${flagId}`,
    });
  }
  return held;
}

export async function decideFlag(db: Db, actor: Actor, input: unknown): Promise<Result<DecisionOutcome>> {
  const parsed = parseInput(FlagDecisionSchema, input);
  if (!parsed.ok) return parsed;
  const d = parsed.value;
  return runInTransaction(db, async (tx) => {
    const flag = await requireFlag(tx, actor.siteId, d.flagId);
    if (flag === null) reject("RECORD.NOT_FOUND", `Flag ${d.flagId} does not exist`, "flagId");
    if (flag.status !== "OPEN")
      reject(
        "SCREENING.ALREADY_DECIDED",
        `This flag was already ${flag.status === "DISMISSED" ? "dismissed" : "confirmed"}`,
        "decision",
      );
    const source = flag.source;
    if (d.decision === "DISMISS") {
      await setFlagDecision(tx, flag.id, {
        status: "DISMISSED",
        decidedAt: actor.now,
        decidedById: actor.userId,
        reason: d.reason,
      });
      await appendAudit(tx, actor, {
        action: "CHANGE",
        entity: "ScreeningFlag",
        entityKey: String(flag.id),
        before: { status: "OPEN" },
        after: { status: "DISMISSED", source: source.code },
        reason: d.reason,
      });
      return {
        flagId: flag.id,
        status: "DISMISSED",
        heldLots: [],
        watch: source.onWatch,
        creditWithheld: source.creditWithheld,
      };
    }
    const held = d.holdLots ? await holdLotsOf(tx, actor, source.id, flag.id) : [];
    const watch = source.onWatch || d.watch;
    const creditWithheld = source.creditWithheld || d.withholdCredit;
    if (watch !== source.onWatch || creditWithheld !== source.creditWithheld) {
      await setSourceStanding(tx, source.id, { onWatch: watch, creditWithheld });
      await appendAudit(tx, actor, {
        action: "CHANGE",
        entity: "Source",
        entityKey: source.code,
        before: { onWatch: source.onWatch, creditWithheld: source.creditWithheld },
        after: { onWatch: watch, creditWithheld },
        reason: `screening flag ${flag.id}`,
      });
    }
    await setFlagDecision(tx, flag.id, {
      status: "CONFIRMED",
      decidedAt: actor.now,
      decidedById: actor.userId,
      reason: d.reason,
      heldLots: held,
    });
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "ScreeningFlag",
      entityKey: String(flag.id),
      before: { status: "OPEN" },
      after: { status: "CONFIRMED", source: source.code, heldLots: held, watch, creditWithheld },
      reason: d.reason,
    });
    return { flagId: flag.id, status: "CONFIRMED", heldLots: held, watch, creditWithheld };
  });
}

/** Clears a source: watch lifted, certified credit released, its lots' holds lifted (they go back to the lab's decision). */
export async function clearSource(
  db: Db,
  actor: Actor,
  input: unknown,
): Promise<Result<{ code: string; released: string[] }>> {
  const parsed = parseInput(ClearSourceSchema, input);
  if (!parsed.ok) return parsed;
  const c = parsed.value;
  return runInTransaction(db, async (tx) => {
    const source = await getSourceProfile(tx, actor.siteId, c.sourceCode);
    if (source === null) reject("RECORD.NOT_FOUND", `Source ${c.sourceCode} does not exist`, "sourceCode");
    const confirmed = await listConfirmedFlagsOf(tx, actor.siteId, source.id);
    if (confirmed.length === 0 && !source.onWatch && !source.creditWithheld)
      reject("SCREENING.NOT_CONFIRMED", `Source ${c.sourceCode} has nothing to clear`, "sourceCode");
    const heldCodes = new Set(confirmed.flatMap((f) => f.heldLots.split(",").filter(Boolean)));
    const released: string[] = [];
    for (const lot of await listOnSiteLotsOf(tx, actor.siteId, source.id)) {
      if (!heldCodes.has(lot.code) || !lot.screeningHold) continue;
      await setLotScreeningHold(tx, lot.id, false);
      released.push(lot.code);
      await appendAudit(tx, actor, {
        action: "CHANGE",
        entity: "FeedstockLot",
        entityKey: lot.code,
        before: { screeningHold: true },
        after: { screeningHold: false },
        reason: `source ${c.sourceCode} cleared: ${c.reason}`,
      });
    }
    for (const f of confirmed)
      await setFlagDecision(tx, f.id, {
        status: "CLEARED",
        decidedAt: actor.now,
        decidedById: actor.userId,
        reason: c.reason,
      });
    await setSourceStanding(tx, source.id, { onWatch: false, creditWithheld: false });
    await appendAudit(tx, actor, {
      action: "CHANGE",
      entity: "Source",
      entityKey: c.sourceCode,
      before: { onWatch: source.onWatch, creditWithheld: source.creditWithheld },
      after: { onWatch: false, creditWithheld: false, released },
      reason: c.reason,
    });
    return { code: c.sourceCode, released };
  });
}
