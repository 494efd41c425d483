import type { BalanceReport } from "@/lib/mass-balance/balance.service";
import type { DomainIssue } from "@/lib/core/result";

/** The text fields of the period form: label, name, input mode, width, and the issue fields that mark it. */
const FIELDS: ReadonlyArray<{
  label: string;
  name: keyof BalanceReport["query"];
  mode?: "numeric" | "decimal";
  size?: number;
  date?: boolean;
  also?: string;
}> = [
  { label: "Year", name: "year", mode: "numeric", size: 5 },
  { label: "Month (1–12)", name: "month", mode: "numeric", size: 3 },
  { label: "Quarter (1–4)", name: "quarter", mode: "numeric", size: 3 },
  { label: "From (custom)", name: "start", date: true, also: "startDate" },
  { label: "Up to, not including", name: "end", date: true, also: "endDate" },
  { label: "Warn above (%)", name: "warnPct", mode: "decimal", size: 5 },
  { label: "Fail above (%)", name: "failPct", mode: "decimal", size: 5 },
];

/** The period asked for; the typed values are kept, else the values the balance resolved. */
export function BalanceForm({
  typed,
  report,
  issues,
}: {
  typed: Record<string, string>;
  report: BalanceReport | null;
  issues: DomainIssue[];
}) {
  const q = report?.query;
  const value = (f: string, fallback: string | number | undefined) =>
    typed[f] !== "" ? typed[f] : fallback === undefined ? "" : String(fallback);
  const bad = (f: string | undefined) => (f !== undefined && issues.some((i) => i.field === f) ? true : undefined);
  return (
    <form method="get" action="/balance" className="query-form" noValidate>
      <fieldset>
        <legend>Period</legend>
        <label>
          Kind
          <select name="period" defaultValue={value("period", q?.period ?? "MONTH")}>
            <option value="MONTH">Month</option>
            <option value="QUARTER">Quarter</option>
            <option value="CUSTOM">Custom dates</option>
          </select>
        </label>
        {FIELDS.map((f) => (
          <label key={f.name}>
            {f.label}
            <input
              name={f.name}
              {...(f.date ? { type: "date" } : { inputMode: f.mode, size: f.size })}
              defaultValue={value(f.name, q?.[f.name])}
              aria-invalid={bad(f.name) ?? bad(f.also)}
            />
          </label>
        ))}
        <button type="submit">Show balance</button>
        {issues.map((i) => (
          <p key={`${i.field ?? ""}${i.message}`} className="form-error" role="alert">
            {i.message}
          </p>
        ))}
      </fieldset>
    </form>
  );
}
