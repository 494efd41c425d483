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

/** SQLite triggers that refuse UPDATE and DELETE on an append-only table (part of the migration). */
export function appendOnlySql(provider: string, table = "Movement"): string {
  if (provider !== "sqlite") return "";
  const code = table === "Movement" ? "LEDGER.APPEND_ONLY: movements" : "AUDIT.APPEND_ONLY: audit events";
  return `
-- Append-only ${table}: corrections are new rows, never edits.
CREATE TRIGGER "${table}_no_update" BEFORE UPDATE ON "${table}"
BEGIN SELECT RAISE(ABORT, '${code} cannot be changed; post a correction'); END;
CREATE TRIGGER "${table}_no_delete" BEFORE DELETE ON "${table}"
BEGIN SELECT RAISE(ABORT, '${code} cannot be deleted; post a correction'); END;
`;
}

/**
 * PostgreSQL's trigger function needs a PL/pgSQL body with semicolons, which the adapter's script
 * runner splits on, so it is applied after every deploy instead, idempotently, in one statement each.
 */
export const PG_APPEND_ONLY_STATEMENTS = [
  `CREATE OR REPLACE FUNCTION "audit_append_only"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'AUDIT.APPEND_ONLY: audit events cannot be changed or deleted';
END;
$$`,
  `CREATE OR REPLACE TRIGGER "AuditEvent_no_update_delete" BEFORE UPDATE OR DELETE ON "AuditEvent"
FOR EACH ROW EXECUTE FUNCTION "audit_append_only"()`,
  `CREATE OR REPLACE FUNCTION "movement_append_only"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'LEDGER.APPEND_ONLY: movements cannot be changed or deleted; post a reversal';
END;
$$`,
  `CREATE OR REPLACE TRIGGER "Movement_no_update_delete" BEFORE UPDATE OR DELETE ON "Movement"
FOR EACH ROW EXECUTE FUNCTION "movement_append_only"()`,
];
