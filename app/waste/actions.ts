"use server";
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { getSiteById } from "@/lib/site/site.store";
import {
  markContainerFull,
  openWasteContainer,
  recordCharacterisation,
  recordDisposal,
} from "@/lib/waste/container.service";
import { chooseWasteRules } from "@/lib/waste/site-rules.service";
import { toSiteInstant } from "@/app/trace/site-time";
import { readNumber, readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

// Waste container records: production and compliance open, characterise and mark full; compliance
// records the haul-away under its manifest. Each call checks the role on the server first.

const OPEN_FIELDS = ["code", "stream", "location", "accumulationStart", "capacityL", "satellite"] as const;
const LAB_FIELDS = ["testedAt", "methanolPct", "pH", "flashPointC", "waterPct"] as const;
const FULL_FIELDS = ["fullAt"] as const;
const HAUL_FIELDS = ["documentNo", "hauler", "disposedAt", "massKg", "destination"] as const;

async function siteInstant(siteId: number, local: string | undefined): Promise<string | undefined> {
  if (local === undefined) return undefined;
  const site = await getSiteById(await getDb(), siteId);
  return toSiteInstant(local, site?.timeZone ?? "UTC");
}

function revalidateWaste(code: string): void {
  revalidatePath("/waste");
  revalidatePath("/waste/due");
  revalidatePath(`/waste/${encodeURIComponent(code)}`);
}

export async function openContainerAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, OPEN_FIELDS);
  const who = await requireRole(["PRODUCTION", "COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, OPEN_FIELDS);
  const actor = actorOf(who.value);
  const r = await openWasteContainer(await getDb(), actor, {
    code: values.code,
    stream: values.stream,
    location: values.location,
    accumulationStart: await siteInstant(actor.siteId, values.accumulationStart),
    capacityL: readNumber(form, "capacityL"),
    satellite: values.satellite === "yes",
  });
  if (!r.ok) return refused(prev, values, r.issues, OPEN_FIELDS);
  revalidateWaste(r.value.code);
  redirect(`/waste/${encodeURIComponent(r.value.code)}`);
}

export async function recordCharacterisationAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, LAB_FIELDS);
  const who = await requireRole(["PRODUCTION", "COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, LAB_FIELDS);
  const actor = actorOf(who.value);
  const r = await recordCharacterisation(await getDb(), actor, {
    containerCode: readText(form, "containerCode"),
    testedAt: await siteInstant(actor.siteId, values.testedAt),
    methanolPct: readNumber(form, "methanolPct"),
    pH: readNumber(form, "pH"),
    flashPointC: readNumber(form, "flashPointC"),
    waterPct: readNumber(form, "waterPct"),
  });
  if (!r.ok) return refused(prev, values, r.issues, LAB_FIELDS);
  revalidateWaste(r.value.code);
  return saved(prev, `Characterisation of ${r.value.code} recorded; the hazard assessment and due date now use it.`);
}

export async function markFullAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, FULL_FIELDS);
  const who = await requireRole(["PRODUCTION", "COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, FULL_FIELDS);
  const actor = actorOf(who.value);
  const r = await markContainerFull(await getDb(), actor, {
    containerCode: readText(form, "containerCode"),
    fullAt: await siteInstant(actor.siteId, values.fullAt),
  });
  if (!r.ok) return refused(prev, values, r.issues, FULL_FIELDS);
  revalidateWaste(r.value.code);
  return saved(prev, `Container ${r.value.code} marked full; it takes no more material and waits for the hauler.`);
}

export async function recordHaulAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, HAUL_FIELDS);
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return refused(prev, values, who.issues, HAUL_FIELDS);
  const actor = actorOf(who.value);
  const r = await recordDisposal(await getDb(), actor, {
    containerCode: readText(form, "containerCode"),
    documentNo: values.documentNo,
    hauler: values.hauler,
    disposedAt: await siteInstant(actor.siteId, values.disposedAt),
    massKg: readNumber(form, "massKg"),
    destination: values.destination,
  });
  if (!r.ok) return refused(prev, values, r.issues, HAUL_FIELDS);
  revalidateWaste(r.value.containerCode);
  return saved(
    prev,
    r.value.emptied
      ? `Haul ${r.value.documentNo} recorded; the container is empty and marked hauled away.`
      : `Haul ${r.value.documentNo} recorded.`,
  );
}

const RULE_FIELDS = [
  "choice",
  "generatorCategory",
  "tsdfDistanceMiles",
  "name",
  "hazardousMaxDays",
  "nonHazardousMaxDays",
  "satelliteExcessDays",
  "satelliteMaxUsGal",
  "reason",
] as const;

/** An administrator or compliance officer chooses the waste rule set the site works to. */
export async function chooseWasteRulesAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, RULE_FIELDS);
  const who = await requireRole(["COMPLIANCE", "ADMIN"]);
  if (!who.ok) return refused(prev, values, who.issues, RULE_FIELDS);
  const actor = actorOf(who.value);
  const r = await chooseWasteRules(await getDb(), actor, {
    choice: values.choice,
    generatorCategory: values.generatorCategory,
    tsdfDistanceMiles: readNumber(form, "tsdfDistanceMiles") ?? null,
    name: values.name,
    hazardousMaxDays: readNumber(form, "hazardousMaxDays"),
    nonHazardousMaxDays: readNumber(form, "nonHazardousMaxDays"),
    satelliteExcessDays: readNumber(form, "satelliteExcessDays"),
    satelliteMaxUsGal: readNumber(form, "satelliteMaxUsGal"),
    reason: values.reason,
  });
  if (!r.ok) return refused(prev, values, r.issues, RULE_FIELDS);
  revalidatePath("/waste", "layout");
  revalidatePath("/");
  return saved(prev, "Rule set saved: the waste pages now work to it.");
}
