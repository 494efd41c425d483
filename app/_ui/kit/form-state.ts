import type { DomainIssue } from "@/lib/core/result";

/** What a form sends back after a refusal or a save: the typed values and the messages by field. */
export interface FormState {
  status: "idle" | "saved" | "refused";
  message: string | null;
  values: Record<string, string>;
  errors: Record<string, string>;
  /** Changes on every answer, so a client form can react to a new one. */
  seq: number;
}

export const IDLE: FormState = { status: "idle", message: null, values: {}, errors: {}, seq: 0 };

export function readText(form: FormData, name: string): string {
  const v = form.get(name);
  return typeof v === "string" ? v.trim() : "";
}

/**
 * A number typed in a form: empty → undefined (the schema says it is required), a decimal comma is
 * read as a point, anything else that is not a number stays NaN so the schema names the field.
 */
export function toNumber(text: string): number | undefined {
  const t = text.trim();
  if (t === "") return undefined;
  const normalised = /^-?\d+,\d+$/.test(t) ? t.replace(",", ".") : t;
  return Number(normalised);
}

export function readNumber(form: FormData, name: string): number | undefined {
  return toNumber(readText(form, name));
}

export function readValues(form: FormData, names: readonly string[]): Record<string, string> {
  return Object.fromEntries(names.map((n) => [n, readText(form, n)]));
}

/** Issues → one message per field (the first), plus those that name no known field. */
export function toFormErrors(
  issues: readonly DomainIssue[],
  known: readonly string[],
  rename: (field: string) => string = (f) => f,
): { errors: Record<string, string>; general: string[] } {
  const errors: Record<string, string> = {};
  const general: string[] = [];
  for (const i of issues) {
    const field = i.field === undefined ? undefined : rename(i.field);
    if (field !== undefined && known.includes(field)) {
      errors[field] ??= i.message;
    } else {
      general.push(i.message);
    }
  }
  return { errors, general };
}

/** The answer to a save: its message, and the values to show again (none: the form starts empty). */
export function saved(prev: FormState, message: string, values: Record<string, string> = {}): FormState {
  return { status: "saved", message, values, errors: {}, seq: prev.seq + 1 };
}

export function refused(
  prev: FormState,
  values: Record<string, string>,
  issues: readonly DomainIssue[],
  known: readonly string[],
  rename?: (field: string) => string,
): FormState {
  const { errors, general } = toFormErrors(issues, known, rename);
  return {
    status: "refused",
    message: general.length > 0 ? general.join(" ") : "Not saved: check the marked fields.",
    values,
    errors,
    seq: prev.seq + 1,
  };
}
