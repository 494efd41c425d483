"use server";
import { screenAfterRecord } from "@/lib/screening/screening.service";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/core/db";
import { requireRole } from "@/lib/auth/request.service";
import { receiveLotFromPickups } from "@/lib/feedstock/lot.service";
import { receiveLotIntoTank } from "@/lib/feedstock/receive-tank.service";
import { listPickupsNotInLot } from "@/lib/collect/collect.store";
import { labelOf } from "@/lib/core/vocabulary";
import type { DomainIssue } from "@/lib/core/result";
import type { FormState } from "@/app/_ui/kit/form-state";
import { readText, refused, saved, toNumber } from "@/app/_ui/kit/form-state";
import { actorOf } from "@/lib/core/actor";

const FIELDS = ["code", "volume", "temp", "notes", "pickups", "tankCode", "acceptReason"] as const;
const RENAME: Readonly<Record<string, string>> = {
  observedVolumeL: "volume",
  observedTempC: "temp",
  receivedAt: "pickups",
};
const rename = (field: string) => (field.startsWith("pickupCodes") ? "pickups" : (RENAME[field] ?? field));

/** One lot from the chosen pickups: one pickup = its own lot; several = pooled; optionally accepted and moved straight into a tank. Production staff only. */
export async function receivePickupsAction(prev: FormState, form: FormData): Promise<FormState> {
  const pickups = form.getAll("pickup").filter((p): p is string => typeof p === "string");
  const t = (name: string) => readText(form, name);
  const values = {
    code: t("code"),
    volume: t("volume"),
    temp: t("temp"),
    notes: t("notes"),
    tankCode: t("tankCode"),
    acceptReason: t("acceptReason"),
    certified: form.get("certified") === "yes" ? "yes" : "",
    pickups: pickups.join(","),
  };
  const refuse = (issues: readonly DomainIssue[]) => refused(prev, values, issues, FIELDS, rename);
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refuse(who.issues);
  const db = await getDb();
  const waiting = await listPickupsNotInLot(db, who.value.siteId);
  const chosen = waiting.filter((p) => pickups.includes(p.code));
  const materials = [...new Set(chosen.map((p) => p.material))];
  if (materials.length > 1) {
    return refuse([
      {
        code: "LOT.MIXED_MATERIAL",
        message: `Pickups: a lot holds one material; these are ${materials.map(labelOf).join(" and ").toLowerCase()}. Make one lot per material.`,
        field: "pickupCodes",
      },
    ]);
  }
  const actor = actorOf(who.value);
  const input = {
    code: values.code,
    material: materials[0] ?? "USED_COOKING_OIL",
    receivedAt: who.value.now,
    observedVolumeL: toNumber(values.volume),
    observedTempC: toNumber(values.temp),
    certified: values.certified === "yes",
    notes: values.notes,
    pickupCodes: pickups,
  };
  const result = values.tankCode
    ? await receiveLotIntoTank(db, actor, { ...input, tankCode: values.tankCode, acceptReason: values.acceptReason })
    : await receiveLotFromPickups(db, actor, input);
  if (!result.ok) return refuse(result.issues);
  await screenAfterRecord(db, actor, { lotCodes: [result.value.code] });
  revalidatePath("/tanks");
  revalidatePath("/receiving");
  revalidatePath("/lots");
  const diffKg = result.value.receivingDifferenceG / 1000;
  return saved(
    prev,
    `Lot ${result.value.code} received from ${pickups.length} pickup${pickups.length === 1 ? "" : "s"}${values.tankCode ? `, accepted and moved whole into tank ${values.tankCode.toUpperCase()} (${(result.value.massG / 1000).toLocaleString("en", { maximumFractionDigits: 1 })} kg)` : ""}; receiving difference ${diffKg >= 0 ? "+" : ""}${diffKg.toFixed(1)} kg against the kerbside estimates.`,
  );
}
