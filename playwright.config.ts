import { execFileSync } from "node:child_process";
import { defineConfig } from "@playwright/test";
import type { JourneyOptions } from "./e2e/support/test";

// Debian's Chromium (no browser downloads here). Every SQLite journey starts on its own copy of the
// demo plant, served by the production build on a free port of its own (e2e/support/plant.ts; the
// demo is loaded once per run by the global setup). The PostgreSQL project's one journey (concurrent
// draws) shares a server on a fresh PostgreSQL database with a shorter demo. No port collides with the
// app the README starts on 3100; E2E_PORT names the run (its template file) and is inherited by workers.
function freePort(): string {
  const script =
    "const s=require('net').createServer();s.listen(0,'127.0.0.1',()=>{process.stdout.write(String(s.address().port));s.close()})";
  return execFileSync(process.execPath, ["-e", script], { encoding: "utf8" }).trim();
}
process.env.E2E_PORT ??= freePort();
process.env.E2E_PG_PORT ??= freePort();
const pgPort = Number(process.env.E2E_PG_PORT);
const withPg = process.env.E2E_PG !== "0";

export default defineConfig<JourneyOptions>({
  testDir: "e2e",
  globalSetup: "./e2e/support/global-setup.ts",
  workers: 1,
  timeout: 120_000,
  // A journey's server is fresh: its first sign-in and first visit to each page load their code.
  expect: { timeout: 10_000 },
  retries: 0,
  reporter: [["list"]],
  use: {
    screenshot: "only-on-failure",
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      args: [
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    },
  },
  projects: [
    { name: "sqlite" },
    ...(withPg
      ? [
          {
            name: "postgresql",
            testMatch: /concurrent-draws\.spec\.ts/,
            use: { sharedServer: `http://127.0.0.1:${pgPort}` },
          },
        ]
      : []),
  ],
  webServer: withPg
    ? [
        {
          command: `bash scripts/e2e-server.sh ${pgPort}`,
          url: `http://127.0.0.1:${pgPort}/login`,
          timeout: 600_000,
          reuseExistingServer: false,
          stdout: "pipe",
        },
      ]
    : [],
});
