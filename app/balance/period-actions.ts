"use server";
import { revalidatePath } from "next/cache";
import { requireRole } from "@/lib/auth/request.service";
import { getDb } from "@/lib/core/db";
import { parseInput } from "@/lib/ledger/parse";
import { closePeriod, PeriodCloseSchema, PeriodReopenSchema, reopenPeriod } from "@/lib/period/period.service";
import { actorOf } from "@/lib/core/actor";

export interface PeriodActionState {
  ok: boolean;
  message: string | null;
  field: string | null;
  /** What the user typed, kept after a refusal. */
  reason: string;
}

async function run(action: "close" | "reopen", form: FormData): Promise<PeriodActionState> {
  const typed = form.get("reason");
  const reason = typeof typed === "string" ? typed : "";
  const who = await requireRole(["COMPLIANCE"]);
  if (!who.ok) return { ok: false, message: who.issues[0]?.message ?? "Refused", field: null, reason };
  const input = {
    periodId: Number(form.get("periodId")),
    ...(reason.trim() === "" && action === "close" ? {} : { reason }),
  };
  const parsed = parseInput(action === "close" ? PeriodCloseSchema : PeriodReopenSchema, input);
  if (!parsed.ok)
    return {
      ok: false,
      message: parsed.issues[0]?.message ?? "Refused",
      field: parsed.issues[0]?.field ?? null,
      reason,
    };
  const actor = actorOf(who.value);
  const db = await getDb();
  const result =
    action === "close" ? await closePeriod(db, actor, parsed.value) : await reopenPeriod(db, actor, parsed.value);
  if (!result.ok)
    return {
      ok: false,
      message: result.issues[0]?.message ?? "Refused",
      field: result.issues[0]?.field ?? null,
      reason,
    };
  revalidatePath("/balance");
  revalidatePath("/periods");
  return {
    ok: true,
    message: action === "close" ? "Period closed and recorded." : "Period reopened; the reason is recorded.",
    field: null,
    reason: "",
  };
}

export async function closePeriodAction(_prev: PeriodActionState, form: FormData): Promise<PeriodActionState> {
  return run("close", form);
}

export async function reopenPeriodAction(_prev: PeriodActionState, form: FormData): Promise<PeriodActionState> {
  return run("reopen", form);
}
