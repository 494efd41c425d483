// Expected outcomes are values with stable codes; only broken preconditions throw.

export type IssueCode = `${Uppercase<string>}.${Uppercase<string>}`;

export interface DomainIssue {
  /** Stable machine code, e.g. "LOT.OVERDRAW". */
  code: IssueCode;
  /** Human message, shown to the user as is. */
  message: string;
  /** Field path the issue belongs to (e.g. "titreMl" or "rows.3.massKg"), when there is one. */
  field?: string;
}

export type Result<T> = { ok: true; value: T } | { ok: false; issues: DomainIssue[] };

export function ok<T>(value: T): Result<T> {
  return { ok: true, value };
}

export function fail<T = never>(code: IssueCode, message: string, field?: string): Result<T> {
  return { ok: false, issues: [field === undefined ? { code, message } : { code, message, field }] };
}

export function failMany<T = never>(issues: DomainIssue[]): Result<T> {
  return { ok: false, issues };
}

/** Thrown only for broken preconditions (programming errors), never for user input. */
export class InvariantError extends Error {
  override name = "InvariantError";
}

export function invariant(condition: unknown, message: string): asserts condition {
  if (!condition) throw new InvariantError(message);
}
