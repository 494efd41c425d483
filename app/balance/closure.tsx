import type { Closure, ClosureTolerance } from "@/lib/mass-balance/period-balance";
import { pct } from "@/app/_ui/format";

const FLAG_CLASS = { OK: "status-pass", WARN: "status-warn", FAIL: "status-fail" } as const;
const FLAG_WORD = { OK: "closes", WARN: "warn", FAIL: "fails" } as const;

/** A closure flag with its percentage, e.g. "closes · 0.000 %". */
export function ClosureChip({ closure, what = "of inputs" }: { closure: Closure; what?: string }) {
  return (
    <span
      className={`status ${FLAG_CLASS[closure.flag]}`}
      title={closure.pct === null ? "no base to compare with" : `${pct(closure.pct, 4)} ${what}`}
    >
      {FLAG_WORD[closure.flag]} · {closure.pct === null ? "no base" : pct(closure.pct, 3)}
    </span>
  );
}

export function ToleranceNote({ tolerance }: { tolerance: ClosureTolerance }) {
  return (
    <>
      Flags: warn above {pct(tolerance.warnPct, 2)}, fail above {pct(tolerance.failPct, 2)} of the inputs. Source:{" "}
      {tolerance.source}. {tolerance.note}
    </>
  );
}
