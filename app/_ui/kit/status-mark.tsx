import { labelOf } from "@/lib/core/vocabulary";

/**
 * One colour meaning per state family, everywhere: good (may go on), waiting (needs someone), bad
 * (stopped), active (in progress), done (closed, nothing more to do). A code not listed is "done".
 */
export const STATUS_FAMILY: Readonly<Record<string, "good" | "waiting" | "bad" | "active" | "done">> = {
  ACCEPTED: "good",
  RELEASED: "good",
  COMPLETE: "good",
  PASS: "good",
  OPEN_PERIOD: "good",
  IN_SPEC: "good",
  QUARANTINED: "waiting",
  HELD: "waiting",
  PLANNED: "waiting",
  FULL: "waiting",
  WARN: "waiting",
  MISSING: "waiting",
  DUE_SOON: "waiting",
  REJECTED: "bad",
  FAIL: "bad",
  VOID: "bad",
  OVERDUE: "bad",
  OUT_OF_SPEC: "bad",
  RUNNING: "active",
  OPEN: "active",
  REPORTED: "active",
  ACTIVE_CUSTOMER: "good",
  FLAG_OPEN: "waiting",
  FLAG_CONFIRMED: "bad",
  FLAG_DISMISSED: "done",
  FLAG_CLEARED: "good",
  ON_WATCH: "waiting",
  CREDIT_WITHHELD: "bad",
  CLOSED: "done",
  CONSUMED: "done",
  SHIPPED: "done",
  NOT_JUDGED: "done",
  SUPERSEDED: "done",
};

export function statusFamily(code: string): "good" | "waiting" | "bad" | "active" | "done" {
  return STATUS_FAMILY[code] ?? "done";
}

/** A state shown as a chip: its plain label, and a colour from its family (never colour alone). */
export function StatusMark({ code, label }: { code: string; label?: string }) {
  return <span className={`status mark-${statusFamily(code)}`}>{label ?? labelOf(code)}</span>;
}
