"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import type { Db } from "@/lib/core/connect";
import type { Actor } from "@/lib/core/actor";
import type { Result } from "@/lib/core/result";
import { requireRole } from "@/lib/auth/request.service";
import { clearSource, decideFlag, saveSourceProfile } from "@/lib/screening/decision.service";
import { screenPeriod } from "@/lib/screening/screening.service";
import { readNumber, readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

/**
 * Checks the role (source checks are compliance's work, checked on the server for each call), runs the
 * service as the signed-in user, and turns a refusal into the form's answer with what was typed kept.
 */
async function asCompliance<T>(
  prev: FormState,
  values: Record<string, string>,
  fields: readonly string[],
  run: (db: Db, actor: Actor) => Promise<Result<T>>,
): Promise<{ ok: true; value: T } | { ok: false; state: FormState }> {
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return { ok: false, state: refused(prev, values, who.issues, fields) };
  const r = await run(await getDb(), actorOf(who.value));
  if (!r.ok) return { ok: false, state: refused(prev, values, r.issues, fields) };
  return { ok: true, value: r.value };
}

const checked = (form: FormData, name: string) => readText(form, name) === "yes" || readText(form, name) === "on";

const DECISION_FIELDS = ["flagId", "decision", "reason", "watch", "holdLots", "withholdCredit"] as const;

export async function decideFlagAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, DECISION_FIELDS);
  const r = await asCompliance(prev, values, DECISION_FIELDS, (db, actor) =>
    decideFlag(db, actor, {
      flagId: readNumber(form, "flagId"),
      decision: readText(form, "decision"),
      reason: readText(form, "reason"),
      watch: checked(form, "watch"),
      holdLots: checked(form, "holdLots"),
      withholdCredit: checked(form, "withholdCredit"),
    }),
  );
  if (!r.ok) return r.state;
  revalidatePath("/screening");
  revalidatePath("/sources/[code]", "page");
  const v = r.value;
  const message =
    v.status === "DISMISSED"
      ? "Flag dismissed."
      : `Flag confirmed.${v.heldLots.length > 0 ? ` Lots on hold: ${v.heldLots.join(", ")}.` : ""}${v.watch ? " Source on watch." : ""}${v.creditWithheld ? " Certified credit withheld." : ""}`;
  return saved(prev, message);
}

const PERIOD_FIELDS = ["from", "to"] as const;

export async function screenPeriodAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, PERIOD_FIELDS);
  const r = await asCompliance(prev, values, PERIOD_FIELDS, (db, actor) =>
    screenPeriod(db, actor, { from: values.from, to: values.to }),
  );
  if (!r.ok) return r.state;
  revalidatePath("/screening");
  const o = r.value;
  return saved(
    prev,
    `Checked ${o.sources} sources, ${o.pickups} pickups and ${o.lots} lots: ${o.created} new flags.`,
    values,
  );
}

const NUMERIC = [
  "fryers",
  "fryerLitres",
  "changesPerWeek",
  "declaredLitresPerMonth",
  "pickupEveryDays",
  "latitude",
  "longitude",
  "opensHour",
  "closesHour",
] as const;
const PROFILE_FIELDS = [
  "sourceCode",
  "kind",
  "capacityBasis",
  "capacityDeclaredAt",
  "capacityDeclaredBy",
  ...NUMERIC,
] as const;

export async function saveSourceProfileAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, PROFILE_FIELDS);
  const input: Record<string, unknown> = { sourceCode: values.sourceCode, kind: values.kind };
  if (values.capacityBasis) input.capacityBasis = values.capacityBasis;
  if (values.capacityDeclaredAt) input.capacityDeclaredAt = values.capacityDeclaredAt;
  if (values.capacityDeclaredBy) input.capacityDeclaredBy = values.capacityDeclaredBy;
  for (const n of NUMERIC) {
    const v = readNumber(form, n);
    if (v !== undefined) input[n] = v;
  }
  const r = await asCompliance(prev, values, PROFILE_FIELDS, (db, actor) => saveSourceProfile(db, actor, input));
  if (!r.ok) return r.state;
  revalidatePath("/sources/[code]", "page");
  return saved(prev, "Capacity and hours saved.", values);
}

const CLEAR_FIELDS = ["sourceCode", "reason"] as const;

export async function clearSourceAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, CLEAR_FIELDS);
  const r = await asCompliance(prev, values, CLEAR_FIELDS, (db, actor) => clearSource(db, actor, values));
  if (!r.ok) return r.state;
  revalidatePath("/sources/[code]", "page");
  revalidatePath("/screening");
  return saved(
    prev,
    `Source cleared.${r.value.released.length > 0 ? ` Holds lifted (back to the lab's decision): ${r.value.released.join(", ")}.` : ""}`,
  );
}
