// npm run db:backup [-- <target file>]   — online backup with a manifest
// npm run db:restore -- <backup file>    — restore (stop the app first) and check counts, ledger, audit chain, balances
// npm run db:check                       — the same checks on the live database
import { mkdirSync } from "node:fs";
import path from "node:path";
import { DEFAULT_DATABASE_URL, isPostgresUrl, openDb } from "@/lib/core/connect";
import { backupDatabase, collectFacts, restoreDatabase } from "@/lib/database/backup";

const url = process.env.DATABASE_URL ?? DEFAULT_DATABASE_URL;
const [command, arg] = process.argv.slice(2);

async function main(): Promise<number> {
  if (command === "backup") {
    const stamp = new Date().toISOString().replace(/[:.]/g, "-");
    const target = arg ?? path.join("backups", `tracevat-${stamp}.${isPostgresUrl(url) ? "pgdump" : "db"}`);
    mkdirSync(path.dirname(path.resolve(target)), { recursive: true });
    const m = await backupDatabase(url, target, new Date());
    console.log(
      `Backup written: ${target} (${m.facts.rowCounts.Movement} movements, ledger ${m.facts.ledgerChecksum.slice(0, 12)}…)`,
    );
    console.log(`Manifest: ${target}.manifest.json`);
    return 0;
  }
  if (command === "restore" && arg) {
    const r = await restoreDatabase(arg, url);
    if (!r.ok) {
      console.error(`Restore refused; the database was not replaced:\n- ${r.problems.join("\n- ")}`);
      return 1;
    }
    console.log(`Restored ${arg}: row counts, ledger checksum, audit chains and book stock all match the backup.`);
    return 0;
  }
  if (command === "check") {
    const db = await openDb(url);
    const f = await collectFacts(db, url).finally(() => db.$disconnect());
    const bad = [
      ...f.stockMismatches,
      ...Object.values(f.auditHeads).filter((h) => h.startsWith("BROKEN")),
      ...(f.integrity === "ok" ? [] : [f.integrity]),
    ];
    console.log(JSON.stringify({ ...f, stockMismatches: f.stockMismatches.length }, null, 2));
    if (bad.length) console.error(`Problems:\n- ${bad.join("\n- ")}`);
    return bad.length ? 1 : 0;
  }
  console.error("usage: backup [target] | restore <backup file> | check");
  return 2;
}

main().then(
  (code) => process.exit(code),
  (e: unknown) => {
    console.error(e instanceof Error ? e.message : e);
    process.exit(1);
  },
);
