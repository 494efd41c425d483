"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/lib/db";
import { requireRole } from "@/lib/auth/request.service";
import { receiveLotFromPickups } from "@/lib/feedstock/lot.service";
import { receiveLotIntoTank } from "@/lib/feedstock/receive-tank.service";
import { listPickupsNotInLot } from "@/lib/collect/collect.store";
import { labelOf } from "@/lib/ledger/kinds";
import type { DomainIssue } from "@/lib/errors";

export interface ReceiveState {
  status: "idle" | "saved" | "refused";
  message: string | null;
  values: { code: string; volume: string; temp: string; notes: string; certified: boolean; pickups: string[]; tankCode: string; acceptReason: string };
  errors: Record<string, string>;
  seq: number;
}

function num(s: string): number | undefined {
  const t = s.trim();
  if (t === "") return undefined;
  return Number(/^-?\d+,\d+$/.test(t) ? t.replace(",", ".") : t);
}

function refused(prev: ReceiveState, values: ReceiveState["values"], issues: readonly DomainIssue[]): ReceiveState {
  const errors: Record<string, string> = {};
  const general: string[] = [];
  const rename: Record<string, string> = { code: "code", observedVolumeL: "volume", observedTempC: "temp", notes: "notes", receivedAt: "pickups", tankCode: "tankCode", acceptReason: "acceptReason" };
  for (const i of issues) {
    const f = i.field?.startsWith("pickupCodes") ? "pickups" : i.field ? rename[i.field] : undefined;
    if (f) errors[f] ??= i.message;
    else general.push(i.message);
  }
  return { status: "refused", message: general.length ? general.join(" ") : "Not saved: check the marked fields.", values, errors, seq: prev.seq + 1 };
}

/** One lot from the chosen pickups: one pickup = its own lot; several = pooled; optionally accepted and moved straight into a tank. Production staff only. */
export async function receivePickupsAction(prev: ReceiveState, form: FormData): Promise<ReceiveState> {
  const text = (n: string) => {
    const v = form.get(n);
    return typeof v === "string" ? v.trim() : "";
  };
  const values = { code: text("code"), volume: text("volume"), temp: text("temp"), notes: text("notes"), certified: form.get("certified") === "on", pickups: form.getAll("pickup").filter((p): p is string => typeof p === "string"), tankCode: text("tankCode"), acceptReason: text("acceptReason") };
  const who = await requireRole(["PRODUCTION"]);
  if (!who.ok) return refused(prev, values, who.issues);
  const db = await getDb();
  const waiting = await listPickupsNotInLot(db, who.value.siteId);
  const chosen = waiting.filter((p) => values.pickups.includes(p.code));
  const materials = [...new Set(chosen.map((p) => p.material))];
  if (materials.length > 1) {
    return refused(prev, values, [{ code: "LOT.MIXED_MATERIAL", message: `Pickups: a lot holds one material; these are ${materials.map(labelOf).join(" and ").toLowerCase()}. Make one lot per material.`, field: "pickupCodes" }]);
  }
  const actor = { siteId: who.value.siteId, userId: who.value.userId, now: who.value.now };
  const input = {
    code: values.code,
    material: materials[0] ?? "USED_COOKING_OIL",
    receivedAt: who.value.now,
    observedVolumeL: num(values.volume),
    observedTempC: num(values.temp),
    certified: values.certified,
    notes: values.notes,
    pickupCodes: values.pickups,
  };
  const result = values.tankCode ? await receiveLotIntoTank(db, actor, { ...input, tankCode: values.tankCode, acceptReason: values.acceptReason }) : await receiveLotFromPickups(db, actor, input);
  if (!result.ok) return refused(prev, values, result.issues);
  revalidatePath("/tanks");
  revalidatePath("/receiving");
  revalidatePath("/lots");
  const diffKg = result.value.receivingDifferenceG / 1000;
  return {
    status: "saved",
    message: `Lot ${result.value.code} received from ${values.pickups.length} pickup${values.pickups.length === 1 ? "" : "s"}${values.tankCode ? `, accepted and moved whole into tank ${values.tankCode.toUpperCase()} (${(result.value.massG / 1000).toLocaleString("en", { maximumFractionDigits: 1 })} kg)` : ""}; receiving difference ${diffKg >= 0 ? "+" : ""}${diffKg.toFixed(1)} kg against the kerbside estimates.`,
    values: { code: "", volume: "", temp: "", notes: "", certified: false, pickups: [], tankCode: "", acceptReason: "" },
    errors: {},
    seq: prev.seq + 1,
  };
}
