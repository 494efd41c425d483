// In-process Prisma schema engine (WASM) over the driver adapters: the Prisma CLI cannot fetch its
// native engines on these machines, so migrations are diffed and applied here instead.
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import { bindMigrationAwareSqlAdapterFactory } from "@prisma/driver-adapter-utils";
import type { SqlMigrationAwareDriverAdapterFactory } from "@prisma/driver-adapter-utils";
import * as bg from "@prisma/schema-engine-wasm/schema_engine_bg";

type Engine = Awaited<ReturnType<typeof bg.SchemaEngine.new>>;

let started = false;
function startWasm(): void {
  if (started) return;
  const require = createRequire(import.meta.url);
  const dir = path.dirname(require.resolve("@prisma/schema-engine-wasm/schema_engine_bg"));
  const module = new WebAssembly.Module(readFileSync(path.join(dir, "schema_engine_bg.wasm")));
  const instance = new WebAssembly.Instance(module, {
    "./schema_engine_bg.js": bg as unknown as WebAssembly.ModuleImports,
  });
  (bg as unknown as { __wbg_set_wasm(e: WebAssembly.Exports): void }).__wbg_set_wasm(instance.exports);
  (instance.exports as { __wbindgen_start(): void }).__wbindgen_start();
  (globalThis as { PRISMA_WASM_PANIC_REGISTRY?: unknown }).PRISMA_WASM_PANIC_REGISTRY ??= { set_message() {} };
  started = true;
}

interface Disposable {
  dispose(): Promise<void>;
}

/**
 * Runs fn with an engine bound to the adapter factory, then frees the engine and disposes every
 * adapter it opened with connect(): the engine never closes them itself, and a leftover SQLite
 * handle holds a lock that times out the next client. Shadow-database adapters are left to the
 * engine, which disposes them (on PostgreSQL that drops the shadow database).
 */
export async function withEngine<T>(
  schemaPath: string,
  factory: SqlMigrationAwareDriverAdapterFactory,
  fn: (engine: Engine) => Promise<T>,
): Promise<T> {
  startWasm();
  const opened: Disposable[] = [];
  const recording = new Proxy(factory, {
    get(target, prop, receiver) {
      const value: unknown = Reflect.get(target, prop, receiver);
      if (prop === "connect" && typeof value === "function") {
        return async (...args: unknown[]) => {
          const adapter = await (value as (...a: unknown[]) => Promise<Disposable>).apply(target, args);
          opened.push(adapter);
          return adapter;
        };
      }
      return typeof value === "function" ? (value as (...a: unknown[]) => unknown).bind(target) : value;
    },
  });
  const datamodel = readFileSync(schemaPath, "utf8");
  const engine = await bg.SchemaEngine.new(
    { datamodels: [[schemaPath, datamodel]] },
    () => {},
    bindMigrationAwareSqlAdapterFactory(recording),
  );
  try {
    return await fn(engine);
  } finally {
    engine.free();
    for (const adapter of opened) await adapter.dispose().catch(() => {});
  }
}

const noFilter = { externalTables: [], externalEnums: [] };

/** SQL that creates the whole schema from an empty database. */
export async function diffFromEmpty(
  schemaPath: string,
  factory: SqlMigrationAwareDriverAdapterFactory,
): Promise<string> {
  return withEngine(schemaPath, factory, async (engine) => {
    const result = await engine.diff({
      from: { tag: "empty" },
      to: { tag: "schemaDatamodel", files: [{ path: schemaPath, content: readFileSync(schemaPath, "utf8") }] },
      script: true,
      exitCode: null,
      filters: noFilter,
    });
    return result.stdout ?? "";
  });
}

/** SQL that turns the old datamodel into the new one (works on both providers). */
export async function diffSchemas(
  oldSchemaText: string,
  newSchemaPath: string,
  factory: SqlMigrationAwareDriverAdapterFactory,
): Promise<string> {
  return withEngine(newSchemaPath, factory, async (engine) => {
    const result = await engine.diff({
      from: { tag: "schemaDatamodel", files: [{ path: newSchemaPath, content: oldSchemaText }] },
      to: { tag: "schemaDatamodel", files: [{ path: newSchemaPath, content: readFileSync(newSchemaPath, "utf8") }] },
      script: true,
      exitCode: null,
      filters: noFilter,
    });
    return result.stdout ?? "";
  });
}

import { readdirSync, existsSync } from "node:fs";

/** Applies every migration in migrationsDir not yet recorded in _prisma_migrations. */
export async function migrateDeploy(
  schemaPath: string,
  migrationsDir: string,
  factory: SqlMigrationAwareDriverAdapterFactory,
): Promise<string[]> {
  const lockPath = path.join(migrationsDir, "migration_lock.toml");
  const dirs = readdirSync(migrationsDir, { withFileTypes: true })
    .filter((d) => d.isDirectory() && existsSync(path.join(migrationsDir, d.name, "migration.sql")))
    .map((d) => d.name)
    .sort();
  return withEngine(schemaPath, factory, async (engine) => {
    const out = await engine.applyMigrations({
      migrationsList: {
        baseDir: migrationsDir,
        lockfile: {
          path: "migration_lock.toml",
          content: existsSync(lockPath) ? readFileSync(lockPath, "utf8") : null,
        },
        shadowDbInitScript: "",
        migrationDirectories: dirs.map((name) => ({
          path: name,
          migrationFile: {
            path: "migration.sql",
            content: { tag: "ok", value: readFileSync(path.join(migrationsDir, name, "migration.sql"), "utf8") },
          },
        })),
      },
      filters: noFilter,
    });
    return out.appliedMigrationNames;
  });
}
