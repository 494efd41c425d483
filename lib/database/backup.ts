// Online backup, restore and the restore check. SQLite uses the engine's online backup API (a
// consistent copy while the app keeps running); PostgreSQL uses pg_dump / pg_restore.
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { copyFileSync, existsSync, readFileSync, renameSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import type { Db } from "@/lib/core/connect";
import { isPostgresUrl, openDb, sqliteFilePath } from "@/lib/core/connect";
import { verifyChain } from "@/lib/audit/chain";

export const CHECKED_TABLES = [
  "Site",
  "User",
  "Source",
  "Holder",
  "Pickup",
  "FeedstockLot",
  "Titration",
  "LabTest",
  "Tank",
  "TankGauge",
  "ReagentLot",
  "Batch",
  "ProductLot",
  "QcResult",
  "Shipment",
  "WasteContainer",
  "Disposal",
  "AccountingPeriod",
  "PeriodEvent",
  "Movement",
  "AuditEvent",
] as const;

export interface DatabaseFacts {
  rowCounts: Record<string, number>;
  /** SHA-256 over every movement (id, at, from, to, grams), in id order: the ledger's fingerprint. */
  ledgerChecksum: string;
  /** Per-site last audit hash, after verifying each chain. */
  auditHeads: Record<string, string>;
  /** Holders whose book stock differs from the sum of their ledger rows (must be empty). */
  stockMismatches: string[];
  integrity: string;
}

/** Everything the restore check compares: counts, ledger checksum, audit chains, balances recomputed. */
export async function collectFacts(db: Db, url: string): Promise<DatabaseFacts> {
  const rowCounts: Record<string, number> = {};
  for (const t of CHECKED_TABLES) {
    const [r] = await db.$queryRawUnsafe<Array<{ n: number | bigint }>>(`SELECT COUNT(*) AS n FROM "${t}"`);
    rowCounts[t] = Number(r?.n ?? 0);
  }
  const hash = createHash("sha256");
  const net = new Map<number, number>();
  const moves = await db.movement.findMany({
    orderBy: { id: "asc" },
    select: { id: true, at: true, fromHolderId: true, toHolderId: true, massG: true },
  });
  for (const m of moves) {
    hash.update(`${m.id}|${m.at.toISOString()}|${m.fromHolderId ?? ""}|${m.toHolderId}|${m.massG}\n`);
    net.set(m.toHolderId, (net.get(m.toHolderId) ?? 0) + m.massG);
    if (m.fromHolderId !== null) net.set(m.fromHolderId, (net.get(m.fromHolderId) ?? 0) - m.massG);
  }
  const stockMismatches = (await db.holder.findMany({ select: { id: true, kind: true, code: true, stockG: true } }))
    .filter((h) => h.stockG !== (net.get(h.id) ?? 0))
    .map((h) => `${h.kind} ${h.code}: book ${h.stockG} g, ledger ${net.get(h.id) ?? 0} g`);
  const auditHeads: Record<string, string> = {};
  for (const s of await db.site.findMany({ select: { id: true, code: true } })) {
    const events = await db.auditEvent.findMany({ where: { siteId: s.id }, orderBy: { seq: "asc" } });
    const v = verifyChain(events);
    auditHeads[s.code] = v.ok ? v.value.lastHash : `BROKEN: ${v.issues[0]?.message ?? ""}`;
  }
  let integrity = "ok";
  if (!isPostgresUrl(url)) {
    const [r] = await db.$queryRawUnsafe<Array<{ integrity_check: string }>>("PRAGMA integrity_check");
    integrity = r?.integrity_check ?? "unknown";
  }
  return { rowCounts, ledgerChecksum: hash.digest("hex"), auditHeads, stockMismatches, integrity };
}

export interface BackupManifest {
  createdAt: string;
  provider: "sqlite" | "postgresql";
  file: string;
  fileSha256: string;
  facts: DatabaseFacts;
}

function sha256File(file: string): string {
  return createHash("sha256").update(readFileSync(file)).digest("hex");
}

/** Writes a consistent copy of the database and a manifest of what it holds. */
export async function backupDatabase(url: string, target: string, now: Date): Promise<BackupManifest> {
  const db = await openDb(url);
  try {
    const facts = await collectFacts(db, url);
    let provider: BackupManifest["provider"];
    if (isPostgresUrl(url)) {
      provider = "postgresql";
      execFileSync("pg_dump", ["--format=custom", `--file=${target}`, url], { stdio: ["ignore", "ignore", "inherit"] });
    } else {
      provider = "sqlite";
      const source = new Database(sqliteFilePath(url), { readonly: true, fileMustExist: true });
      try {
        await source.backup(target);
      } finally {
        source.close();
      }
    }
    const manifest: BackupManifest = {
      createdAt: now.toISOString(),
      provider,
      file: path.basename(target),
      fileSha256: sha256File(target),
      facts,
    };
    writeFileSync(`${target}.manifest.json`, `${JSON.stringify(manifest, null, 2)}\n`);
    return manifest;
  } finally {
    await db.$disconnect();
  }
}

export interface RestoreReport {
  ok: boolean;
  problems: string[];
  facts: DatabaseFacts;
}

/** Compares a restored database with the manifest taken at backup time. */
export function compareFacts(expected: DatabaseFacts, actual: DatabaseFacts): string[] {
  const problems: string[] = [];
  for (const [t, n] of Object.entries(expected.rowCounts))
    if (actual.rowCounts[t] !== n) problems.push(`${t}: ${actual.rowCounts[t] ?? 0} rows, expected ${n}`);
  if (actual.ledgerChecksum !== expected.ledgerChecksum) problems.push("ledger checksum differs from the backup's");
  for (const [site, h] of Object.entries(expected.auditHeads))
    if (actual.auditHeads[site] !== h)
      problems.push(`audit chain of site ${site}: ${actual.auditHeads[site] ?? "missing"}`);
  if (actual.stockMismatches.length)
    problems.push(
      `${actual.stockMismatches.length} holders' book stock differs from the ledger, e.g. ${actual.stockMismatches[0]}`,
    );
  if (actual.integrity !== "ok") problems.push(`integrity check: ${actual.integrity}`);
  return problems;
}

/**
 * Restores a backup into url and checks it. SQLite: the file is verified against the manifest's
 * checksum, copied beside the target, checked, and only then moved into place. Stop the app first.
 */
export async function restoreDatabase(backup: string, url: string): Promise<RestoreReport> {
  const manifest = JSON.parse(readFileSync(`${backup}.manifest.json`, "utf8")) as BackupManifest;
  if (sha256File(backup) !== manifest.fileSha256)
    return { ok: false, problems: ["the backup file does not match its manifest checksum"], facts: manifest.facts };
  if (isPostgresUrl(url)) {
    if (manifest.provider !== "postgresql")
      return {
        ok: false,
        problems: ["a SQLite backup cannot be restored into PostgreSQL with this command"],
        facts: manifest.facts,
      };
    execFileSync("pg_restore", ["--clean", "--if-exists", "--no-owner", `--dbname=${url}`, backup], {
      stdio: ["ignore", "ignore", "inherit"],
    });
    const db = await openDb(url);
    try {
      const facts = await collectFacts(db, url);
      const problems = compareFacts(manifest.facts, facts);
      return { ok: problems.length === 0, problems, facts };
    } finally {
      await db.$disconnect();
    }
  }
  const target = path.resolve(sqliteFilePath(url));
  const side = `${target}.restoring`;
  for (const f of [side, `${side}-wal`, `${side}-shm`]) rmSync(f, { force: true });
  copyFileSync(backup, side);
  const db = await openDb(`file:${side}`);
  let facts: DatabaseFacts;
  try {
    facts = await collectFacts(db, `file:${side}`);
    await db.$queryRawUnsafe("PRAGMA wal_checkpoint(TRUNCATE)");
  } finally {
    await db.$disconnect();
  }
  const problems = compareFacts(manifest.facts, facts);
  if (problems.length) {
    rmSync(side, { force: true });
    return { ok: false, problems, facts };
  }
  if (existsSync(target)) renameSync(target, `${target}.before-restore`);
  for (const f of [`${target}-wal`, `${target}-shm`]) rmSync(f, { force: true });
  renameSync(side, target);
  for (const f of [`${side}-wal`, `${side}-shm`]) rmSync(f, { force: true });
  return { ok: true, problems: [], facts };
}
