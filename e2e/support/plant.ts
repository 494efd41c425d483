// Each journey's own demo plant: the demo is loaded once per run into a template database
// (global-setup.ts), and every test gets a copy of that file and the built app started on a port of its
// own against it, so no journey sees what another journey booked.
import { copyFileSync, rmSync } from "node:fs";
import path from "node:path";
import { AppServer, anyFreePort, ROOT } from "../../scripts/app-server";

/** The demo's fixed "today", so dates in the journeys never drift. */
export const DEMO_ANCHOR = "2026-12-02";

/** The template the run's global setup loads the demo into (one per run, named by the runner's port). */
export function templateFile(): string {
  return path.join(ROOT, "data", `e2e-template-${process.env.E2E_PORT ?? "local"}.db`);
}

export interface Plant {
  baseURL: string;
  /** The plant's SQLite file, for journeys that check what was stored. */
  dbFile: string;
  stop(): Promise<void>;
}

/** The database file of the plant the running test started (a worker runs one test at a time). */
let running: string | null = null;

/** The running test's plant database, for journeys that check what was stored. */
export function plantDatabase(): string {
  if (!running) throw new Error("no plant is running: the test must use page, request or baseURL first");
  return running;
}

function removeDatabase(file: string): void {
  for (const suffix of ["", "-wal", "-shm"]) rmSync(`${file}${suffix}`, { force: true });
}

/** A copy of the demo template served by the built app on a free port. */
export async function startPlant(tag: string): Promise<Plant> {
  const dbFile = path.join(ROOT, "data", `e2e-plant-${tag}.db`);
  removeDatabase(dbFile);
  copyFileSync(templateFile(), dbFile);
  const server = await AppServer.start(`file:${dbFile}`, await anyFreePort(), { DEMO_ANCHOR });
  running = dbFile;
  return {
    baseURL: server.base,
    dbFile,
    stop: async () => {
      await server.stop();
      running = null;
      removeDatabase(dbFile);
    },
  };
}
