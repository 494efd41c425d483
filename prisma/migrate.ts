// Migration commands, run in-process over the driver adapters (the Prisma CLI can't fetch its engines here).
//   tsx prisma/migrate.ts deploy        apply pending migrations to DATABASE_URL (default SQLite file)
//   tsx prisma/migrate.ts new <name>    write a migration for both providers from the last snapshot to schema.prisma
import { copyFileSync, existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { PrismaBetterSqlite3 } from "@prisma/adapter-better-sqlite3";
import { PrismaPg } from "@prisma/adapter-pg";
import { adapterFor, DEFAULT_DATABASE_URL, isPostgresUrl } from "@/lib/core/connect";
import { diffFromEmpty, diffSchemas, migrateDeploy } from "./engine";
import pg from "pg";
import { appendOnlySql, constraintSql, PG_APPEND_ONLY_STATEMENTS } from "./hardening";

const root = path.resolve(import.meta.dirname);
export const PROVIDERS = {
  sqlite: { schema: path.join(root, "schema.prisma"), migrations: path.join(root, "migrations") },
  postgresql: { schema: path.join(root, "pg", "schema.prisma"), migrations: path.join(root, "pg", "migrations") },
} as const;

export async function deploy(url: string): Promise<string[]> {
  const p = isPostgresUrl(url) ? PROVIDERS.postgresql : PROVIDERS.sqlite;
  const applied = await migrateDeploy(p.schema, p.migrations, adapterFor(url));
  if (isPostgresUrl(url)) {
    const client = new pg.Client({ connectionString: url });
    await client.connect();
    try {
      for (const statement of PG_APPEND_ONLY_STATEMENTS) await client.query(statement);
    } finally {
      await client.end();
    }
  }
  return applied;
}

async function createMigration(name: string): Promise<void> {
  const stamp = new Date().toISOString().replace(/\D/g, "").slice(0, 14);
  const folder = `${stamp}_${name.replace(/[^a-z0-9_]/gi, "_")}`;
  for (const [provider, p] of Object.entries(PROVIDERS)) {
    const factory =
      provider === "sqlite"
        ? new PrismaBetterSqlite3({ url: "file::memory:" })
        : new PrismaPg({ connectionString: process.env.TEST_PG_URL ?? "postgresql://postgres@127.0.0.1:5432/test" });
    mkdirSync(p.migrations, { recursive: true });
    const previous = readdirSync(p.migrations)
      .filter((d) => existsSync(path.join(p.migrations, d, "schema.prisma")))
      .sort()
      .at(-1);
    let sql: string;
    if (previous === undefined) {
      sql = constraintSql(provider, await diffFromEmpty(p.schema, factory)) + appendOnlySql(provider);
    } else {
      sql = await diffSchemas(
        readFileSync(path.join(p.migrations, previous, "schema.prisma"), "utf8"),
        p.schema,
        factory,
      );
      for (const table of ["Movement", "AuditEvent"]) {
        if (provider === "sqlite" && new RegExp(`DROP TABLE "${table}"|ALTER TABLE "new_${table}"`).test(sql)) {
          sql += appendOnlySql(provider, table); // a SQLite table redefinition drops its triggers: restore them
        }
      }
    }
    if (sql.trim() === "" || /^-- This is an empty migration/.test(sql.trim())) {
      console.log(`${provider}: schema unchanged, no migration written`);
      continue;
    }
    const dir = path.join(p.migrations, folder);
    mkdirSync(dir, { recursive: true });
    writeFileSync(path.join(dir, "migration.sql"), sql);
    copyFileSync(p.schema, path.join(dir, "schema.prisma"));
    writeFileSync(path.join(p.migrations, "migration_lock.toml"), `provider = "${provider}"\n`);
    console.log(`${provider}: wrote ${path.relative(process.cwd(), dir)}`);
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) {
  const [command, arg] = process.argv.slice(2);
  const run = async () => {
    if (command === "deploy") {
      const url = process.env.DATABASE_URL ?? DEFAULT_DATABASE_URL;
      const applied = await deploy(url);
      console.log(applied.length ? `migrations applied: ${applied.join(", ")}` : "database schema is up to date");
    } else if (command === "new" && arg) {
      await createMigration(arg);
    } else {
      console.error("usage: tsx prisma/migrate.ts deploy | new <name>");
      process.exitCode = 2;
    }
  };
  run()
    .then(() => process.exit(process.exitCode ?? 0)) // PG leaves a ~10 s timer open after applyMigrations
    .catch((e: unknown) => {
      console.error(e instanceof Error ? e.message : e);
      process.exit(1);
    });
}
