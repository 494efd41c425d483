// Formula injection: a text cell that begins with = + - @ (or a tab / carriage return) is run as a
// formula by spreadsheet programs. Exported text cells get a leading apostrophe, the usual guard
// (OWASP "CSV Injection"); on import that apostrophe is taken off again, so a round-trip is unchanged.
const TRIGGERS = /^[=+\-@\t\r]/;

export function neutraliseFormula(text: string): string {
  return TRIGGERS.test(text) ? `'${text}` : text;
}

export function unneutralise(text: string): string {
  return text.length > 1 && text.startsWith("'") && TRIGGERS.test(text.slice(1)) ? text.slice(1) : text;
}
