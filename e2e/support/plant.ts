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

function removeDatabase(file: string): void {
  for (const suffix of ["", "-wal", "-shm"]) rmSync(`${file}${suffix}`, { force: true });
}

/** A copy of the demo template served by the built app on a free port. */
async function startPlant(tag: string): Promise<Plant> {
  const dbFile = path.join(ROOT, "data", `e2e-plant-${tag}.db`);
  removeDatabase(dbFile);
  copyFileSync(templateFile(), dbFile);
  const server = await AppServer.start(`file:${dbFile}`, await anyFreePort(), { DEMO_ANCHOR });
  return {
    baseURL: server.base,
    dbFile,
    stop: async () => {
      await server.stop();
      removeDatabase(dbFile);
    },
  };
}

/** The database file of the plant the running test took (a worker runs one test at a time). */
let running: string | null = null;

/** The running test's plant database, for journeys that check what was stored. */
export function plantDatabase(): string {
  if (!running) throw new Error("no plant is running: the test must use page, request or baseURL first");
  return running;
}

/**
 * One worker's plants. A spare plant is started while the current test runs, so a test waits for a
 * server only when it follows a very short one; a finished test's plant is stopped in the background.
 */
export class PlantPool {
  private spare: Promise<Plant> | null = null;
  private readonly stopping = new Set<Promise<void>>();
  private serial = 0;

  constructor(private readonly worker: number) {}

  private start(): Promise<Plant> {
    this.serial += 1;
    const plant = startPlant(`${this.worker}-${this.serial}-${process.pid}`);
    plant.catch(() => undefined); // a failed spare is reported by the test that takes it
    return plant;
  }

  /** A fresh plant for one test; the next one starts at once. */
  async take(): Promise<Plant> {
    const plant = this.spare ?? this.start();
    this.spare = this.start();
    const taken = await plant;
    running = taken.dbFile;
    return taken;
  }

  /** The test is over: its plant is stopped and its database removed, without holding up the next test. */
  release(plant: Plant): void {
    running = null;
    const stopped = plant.stop().finally(() => this.stopping.delete(stopped));
    this.stopping.add(stopped);
  }

  async close(): Promise<void> {
    const spare = this.spare;
    this.spare = null;
    if (spare) await spare.then((p) => p.stop()).catch(() => undefined);
    await Promise.all([...this.stopping]);
  }
}
