"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { getSiteById } from "@/lib/site/site.store";
import { recordGauge, transferToTank } from "@/lib/tank/tank.service";
import { gramsToKg } from "@/lib/quantity/units";
import { readNumber, readText, readValues, refused, saved } from "@/app/_ui/kit/form-state";
import type { FormState } from "@/app/_ui/kit/form-state";
import { toSiteInstant } from "@/app/trace/site-time";
import { actorOf } from "@/lib/core/actor";

// Moves into tanks and gauge readings, by production staff; every check is the service's.

const MOVE_FIELDS = ["fromKind", "fromCode", "toTankCode", "all", "massKg", "volumeL", "tempC", "at", "note"] as const;
/** Fields shown on the move form; a refusal of the source itself (not accepted, not found) is said above the form. */
const MOVE_SHOWN = ["toTankCode", "all", "massKg", "volumeL", "tempC", "at", "note"];
const GAUGE_FIELDS = ["tankCode", "method", "volumeL", "levelMm", "tempC", "densityKgM3", "at", "note"] as const;
const GAUGE_SHOWN = ["method", "volumeL", "levelMm", "tempC", "densityKgM3", "at", "note"];

const kgText = (g: number) => `${gramsToKg(g).toLocaleString("en", { maximumFractionDigits: 1 })} kg`;

/**
 * The form's site-time minute as an instant. Empty, left as the page showed it, or the current minute
 * means now: the field shows whole minutes, and "now" must not fall before a receipt seconds earlier.
 */
async function timeOf(form: FormData, siteId: number, now: Date): Promise<string | Date> {
  const local = readText(form, "at");
  if (local === "" || local === readText(form, "shownAt")) return now;
  const instant = toSiteInstant(local, (await getSiteById(await getDb(), siteId))?.timeZone ?? "UTC");
  if (instant === undefined) return now;
  const t = Date.parse(instant);
  return Number.isFinite(t) && Math.floor(t / 60_000) === Math.floor(now.getTime() / 60_000) ? now : instant;
}

/** Material from a lot or a tank into a tank: a mass, a volume read at a temperature, or all of it. */
export async function moveToTankAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, MOVE_FIELDS);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, MOVE_SHOWN);
  const input = {
    fromKind: values.fromKind,
    fromCode: values.fromCode,
    toTankCode: values.toTankCode ?? "",
    at: await timeOf(form, who.value.siteId, who.value.now),
    note: readText(form, "note"),
    all: values.all === "yes",
    massKg: readNumber(form, "massKg"),
    volumeL: readNumber(form, "volumeL"),
    tempC: readNumber(form, "tempC"),
  };
  const r = await transferToTank(await getDb(), actorOf(who.value), input);
  if (!r.ok) return refused(prev, values, r.issues, MOVE_SHOWN);
  revalidatePath("/tanks");
  revalidatePath("/lots/[code]", "page");
  revalidatePath("/tanks/[code]", "page");
  const v = r.value.fromVolume;
  const conversion = v
    ? ` (${v.volumeL.toLocaleString("en")} L at ${v.tempC} °C × ${v.densityKgM3.toFixed(1)} kg/m³)`
    : "";
  return saved(prev, `Moved ${kgText(r.value.massG)}${conversion} into tank ${input.toTankCode.toUpperCase()}.`);
}

/** A gauge reading with the book stock at that moment beside it. */
export async function recordGaugeAction(prev: FormState, form: FormData): Promise<FormState> {
  const values = readValues(form, GAUGE_FIELDS);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues, GAUGE_SHOWN);
  const method = values.method === "LEVEL" ? "LEVEL" : "VOLUME";
  const density = readNumber(form, "densityKgM3");
  const input = {
    tankCode: values.tankCode,
    method,
    at: await timeOf(form, who.value.siteId, who.value.now),
    tempC: readNumber(form, "tempC"),
    note: readText(form, "note"),
    ...(method === "LEVEL" ? { levelMm: readNumber(form, "levelMm") } : { volumeL: readNumber(form, "volumeL") }),
    ...(density === undefined ? {} : { densityKgM3: density }),
  };
  const r = await recordGauge(await getDb(), actorOf(who.value), input);
  if (!r.ok) return refused(prev, values, r.issues, GAUGE_SHOWN);
  revalidatePath("/tanks");
  revalidatePath("/tanks/[code]", "page");
  const g = r.value;
  const pct = g.differencePct === null ? "" : ` (${g.differencePct >= 0 ? "+" : ""}${g.differencePct.toFixed(2)} %)`;
  return saved(
    prev,
    `Gauge recorded: ${(g.volumeMl / 1000).toLocaleString("en", { maximumFractionDigits: 1 })} L = ${kgText(g.massG)}; book stock then ${kgText(g.bookStockG)}; difference ${g.differenceG >= 0 ? "+" : "−"}${kgText(Math.abs(g.differenceG))}${pct}.`,
  );
}
