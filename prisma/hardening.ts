// SQL the schema language can't express: CHECK constraints on quantities and append-only triggers on the ledger.

/** Adds CHECK constraints to the generated CREATE TABLE statements. */
export function constraintSql(provider: string, sql: string): string {
  const rules: Array<[RegExp, string]> = [
    [/("stockG" INTEGER NOT NULL DEFAULT 0)/, '$1 CHECK ("stockG" >= 0)'],
    [/(CREATE TABLE "Movement" \([\s\S]*?"massG" INTEGER NOT NULL)/, '$1 CHECK ("massG" > 0)'],
  ];
  let out = sql;
  for (const [pattern, replacement] of rules) {
    if (!pattern.test(out)) throw new Error(`hardening (${provider}): pattern not found: ${pattern}`);
    out = out.replace(pattern, replacement);
  }
  return out;
}

/** SQLite triggers that refuse UPDATE and DELETE on the movement ledger (part of the migration). */
export function appendOnlySql(provider: string): string {
  if (provider === "sqlite") {
    return `
-- Append-only ledger: corrections are new reversing rows, never edits.
CREATE TRIGGER "Movement_no_update" BEFORE UPDATE ON "Movement"
BEGIN SELECT RAISE(ABORT, 'LEDGER.APPEND_ONLY: movements cannot be changed; post a reversal'); END;
CREATE TRIGGER "Movement_no_delete" BEFORE DELETE ON "Movement"
BEGIN SELECT RAISE(ABORT, 'LEDGER.APPEND_ONLY: movements cannot be deleted; post a reversal'); END;
`;
  }
  return "";
}

/**
 * PostgreSQL's trigger function needs a PL/pgSQL body with semicolons, which the adapter's script
 * runner splits on, so it is applied after every deploy instead, idempotently, in one statement each.
 */
export const PG_APPEND_ONLY_STATEMENTS = [
  `CREATE OR REPLACE FUNCTION "movement_append_only"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'LEDGER.APPEND_ONLY: movements cannot be changed or deleted; post a reversal';
END;
$$`,
  `CREATE OR REPLACE TRIGGER "Movement_no_update_delete" BEFORE UPDATE OR DELETE ON "Movement"
FOR EACH ROW EXECUTE FUNCTION "movement_append_only"()`,
];
