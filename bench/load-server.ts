// The servers a load run measures: a fresh demo database (SQLite file or a PostgreSQL database of its
// own), the built app started with `next start` on a free port, its resident memory sampled, and
// everything removed again at the end. Builds nothing: a missing `next build` is reported and the run stops.
import { spawn } from "node:child_process";
import { copyFileSync, existsSync, readdirSync, rmSync } from "node:fs";
import path from "node:path";
import pg from "pg";
import { ROOT } from "@/scripts/app-server";

export { AppServer, findFreePort, ROOT } from "@/scripts/app-server";

export const PG_BASE = process.env.LOAD_PG_URL ?? "postgresql://postgres@127.0.0.1:5432/postgres";

export function requireBuild(): void {
  if (!existsSync(path.join(ROOT, ".next", "BUILD_ID"))) {
    console.error(
      "npm run load measures the production build and builds nothing: run `npx next build` first, then `npm run load` again.",
    );
    process.exit(2);
  }
}

export interface LoadDatabase {
  kind: "sqlite" | "postgresql";
  url: string;
  drop(): Promise<void>;
}

/** A fresh, empty database for this run: data/load-<tag>.db, or the PostgreSQL database tracevat_load_<tag>. */
export async function createDatabase(kind: "sqlite" | "postgresql", tag: string): Promise<LoadDatabase> {
  if (kind === "sqlite") {
    const file = path.join(ROOT, "data", `load-${tag}.db`);
    const remove = () => {
      for (const suffix of ["", "-wal", "-shm", ".loading", ".loading-wal", ".loading-shm"])
        rmSync(`${file}${suffix}`, { force: true });
    };
    remove();
    return { kind, url: `file:${file}`, drop: () => Promise.resolve(remove()) };
  }
  const name = `tracevat_load_${tag}`;
  const admin = async (sql: string) => {
    const c = new pg.Client({ connectionString: PG_BASE });
    await c.connect();
    try {
      await c.query(sql);
    } finally {
      await c.end();
    }
  };
  await admin(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  await admin(`CREATE DATABASE "${name}"`);
  return {
    kind,
    url: `${PG_BASE.replace(/\/[^/]*$/, "")}/${name}`,
    drop: () => admin(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`),
  };
}

async function pgAdmin(sql: string, params: unknown[] = []): Promise<pg.QueryResult> {
  const c = new pg.Client({ connectionString: PG_BASE });
  await c.connect();
  try {
    return await c.query(sql, params);
  } finally {
    await c.end();
  }
}

/** Names a demo by its length, today's date (the demo's anchor) and the latest migration, so a template never outlives its schema. */
function templateKey(days: number): string {
  const migrations = readdirSync(path.join(ROOT, "prisma", "migrations"))
    .filter((d) => /^\d{14}_/.test(d))
    .sort();
  const last = migrations[migrations.length - 1]?.slice(0, 14) ?? "none";
  return `${days}d_${new Date().toISOString().slice(0, 10).replace(/-/g, "")}_${last}`;
}

/**
 * A fresh demo database for this run. The demo is loaded once into a template (data/load-template-….db,
 * or the PostgreSQL database tracevat_load_tpl_…) and each run gets a copy, because loading takes
 * minutes on a busy 2-core machine. Returns how long loading took (0 when the template existed).
 */
export async function createDemoDatabase(
  kind: "sqlite" | "postgresql",
  tag: string,
  days: number,
): Promise<{ database: LoadDatabase; seedMs: number; dropTemplate: () => Promise<void> }> {
  const key = templateKey(days);
  if (kind === "sqlite") {
    const template = path.join(ROOT, "data", `load-template-${key}.db`);
    let seedMs = 0;
    if (!existsSync(template))
      seedMs = await seedDemo({ kind, url: `file:${template}`, drop: () => Promise.resolve() }, days);
    const database = await createDatabase(kind, tag);
    copyFileSync(template, database.url.slice("file:".length));
    return { database, seedMs, dropTemplate: () => Promise.resolve(rmSync(template, { force: true })) };
  }
  const template = `tracevat_load_tpl_${key}`;
  let seedMs = 0;
  const exists = (await pgAdmin("SELECT 1 FROM pg_database WHERE datname = $1", [template])).rowCount === 1;
  if (!exists) {
    await pgAdmin(`CREATE DATABASE "${template}"`);
    try {
      seedMs = await seedDemo(
        { kind, url: `${PG_BASE.replace(/\/[^/]*$/, "")}/${template}`, drop: () => Promise.resolve() },
        days,
      );
    } catch (e) {
      await pgAdmin(`DROP DATABASE IF EXISTS "${template}" WITH (FORCE)`);
      throw e;
    }
  }
  const name = `tracevat_load_${tag}`;
  await pgAdmin(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  await pgAdmin(`CREATE DATABASE "${name}" TEMPLATE "${template}"`);
  const database: LoadDatabase = {
    kind,
    url: `${PG_BASE.replace(/\/[^/]*$/, "")}/${name}`,
    drop: async () => void (await pgAdmin(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`)),
  };
  return {
    database,
    seedMs,
    dropTemplate: async () => void (await pgAdmin(`DROP DATABASE IF EXISTS "${template}" WITH (FORCE)`)),
  };
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { cwd: ROOT, env, stdio: ["ignore", "ignore", "inherit"] });
    child.once("error", reject);
    child.once("exit", (code) =>
      code === 0 ? resolve() : reject(new Error(`${cmd} ${args.join(" ")} exited with ${code}`)),
    );
  });
}

/** Loads the demo plant (seeds/load.ts) into the database; DEMO_DAYS sets its length. */
export async function seedDemo(db: LoadDatabase, days: number): Promise<number> {
  const t0 = performance.now();
  await run(process.execPath, ["--conditions=react-server", "--import", "tsx", "seeds/load.ts"], {
    ...process.env,
    DATABASE_URL: db.url,
    DEMO_DAYS: String(days),
  });
  return performance.now() - t0;
}
