import type { ReactNode } from "react";
import type { DomainIssue } from "@/lib/core/result";

/**
 * The question a report page asks before it answers: its fields sent in the address (so the answer can be
 * bookmarked and printed), the button, and what was wrong with the question, each message read out.
 */
export function QueryForm({
  action,
  legend,
  submitLabel,
  issues,
  children,
}: {
  action: string;
  legend: string;
  submitLabel: string;
  issues: readonly DomainIssue[];
  children: ReactNode;
}) {
  return (
    <form method="get" action={action} className="query-form" noValidate>
      <fieldset>
        <legend>{legend}</legend>
        {children}
        <button type="submit">{submitLabel}</button>
        {issues.map((i) => (
          <p key={`${i.field ?? ""}${i.message}`} className="form-error" role="alert">
            {i.message}
          </p>
        ))}
      </fieldset>
    </form>
  );
}
