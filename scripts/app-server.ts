// The built app served by `next start` on a port of its own against a database of its own, for the
// load run (bench/load.ts) and the browser journeys (e2e/support/plant.ts). Builds nothing.
import { spawn } from "node:child_process";
import type { ChildProcess } from "node:child_process";
import { openSync, readFileSync } from "node:fs";
import net from "node:net";
import path from "node:path";

export const ROOT = path.resolve(import.meta.dirname, "..");

async function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.once("error", () => resolve(false));
    s.listen(port, "127.0.0.1", () => s.close(() => resolve(true)));
  });
}

/** The first free port from `from` up to `to`. */
export async function findFreePort(from: number, to: number, taken: ReadonlySet<number> = new Set()): Promise<number> {
  for (let p = from; p <= to; p++) if (!taken.has(p) && (await portIsFree(p))) return p;
  throw new Error(`no free port between ${from} and ${to}`);
}

/** A port the system has free right now (the kernel's choice). */
export async function anyFreePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const address = s.address();
      const port = typeof address === "object" && address ? address.port : 0;
      s.close(() => resolve(port));
    });
  });
}

/** Resident memory of a process and its children, in MB (Linux /proc). */
function treeRssMb(pid: number): number {
  let kb = 0;
  const visit = (p: number) => {
    try {
      const status = readFileSync(`/proc/${p}/status`, "utf8");
      kb += Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0);
      const children = readFileSync(`/proc/${p}/task/${p}/children`, "utf8").trim();
      for (const c of children.split(/\s+/).filter(Boolean)) visit(Number(c));
    } catch {
      /* the process ended between reads */
    }
  };
  visit(pid);
  return kb / 1024;
}

export class AppServer {
  private peak = 0;
  private readonly timer: NodeJS.Timeout;

  private constructor(
    readonly base: string,
    readonly port: number,
    private readonly child: ChildProcess,
  ) {
    this.timer = setInterval(() => this.sample(), 250);
    this.timer.unref();
  }

  /** `next start` on the port against the database; resolves once the sign-in page answers. */
  static async start(databaseUrl: string, port: number, env: Record<string, string> = {}): Promise<AppServer> {
    // APP_CPU_PROF_DIR writes a V8 CPU profile of each server there when it stops (node refuses
    // --cpu-prof in NODE_OPTIONS, so the server is started through node itself).
    const profDir = process.env.APP_CPU_PROF_DIR;
    const child = spawn(
      profDir ? process.execPath : path.join(ROOT, "node_modules", ".bin", "next"),
      [
        ...(profDir
          ? ["--cpu-prof", `--cpu-prof-dir=${profDir}`, path.join(ROOT, "node_modules", "next", "dist", "bin", "next")]
          : []),
        "start",
        "-H",
        "127.0.0.1",
        "-p",
        String(port),
      ],
      {
        cwd: ROOT,
        env: {
          ...process.env,
          DATABASE_URL: databaseUrl,
          NODE_ENV: "production",
          LOG_LEVEL: process.env.LOG_LEVEL ?? "warn",
          ...env,
        },
        // APP_LOG_DIR keeps each server's log lines (JSON, one per line) in server-<port>.log there.
        stdio: [
          "ignore",
          process.env.APP_LOG_DIR ? openSync(path.join(process.env.APP_LOG_DIR, `server-${port}.log`), "a") : "ignore",
          "inherit",
        ],
        detached: false,
      },
    );
    const server = new AppServer(`http://127.0.0.1:${port}`, port, child);
    const deadline = Date.now() + 180_000;
    for (;;) {
      if (child.exitCode !== null) throw new Error(`next start on port ${port} exited with ${child.exitCode}`);
      try {
        const r = await fetch(`${server.base}/login`);
        if (r.ok) return server;
      } catch {
        /* not listening yet */
      }
      if (Date.now() > deadline) {
        await server.stop();
        throw new Error(`next start on port ${port} did not answer within 180 s`);
      }
      await new Promise((r) => setTimeout(r, 100));
    }
  }

  sample(): void {
    if (this.child.pid !== undefined) this.peak = Math.max(this.peak, treeRssMb(this.child.pid));
  }

  /** The highest resident memory sampled since the last call, and start again. */
  takePeakMb(): number {
    this.sample();
    const p = this.peak;
    this.peak = 0;
    return p;
  }

  async stop(): Promise<void> {
    clearInterval(this.timer);
    if (this.child.exitCode !== null) return;
    const exited = new Promise<void>((resolve) => this.child.once("exit", () => resolve()));
    // SIGINT lets a profiled server write its profile; next start stops the same way on either.
    this.child.kill(process.env.APP_CPU_PROF_DIR ? "SIGINT" : "SIGTERM");
    const timeout = setTimeout(() => this.child.kill("SIGKILL"), 10_000);
    await exited;
    clearTimeout(timeout);
  }
}
