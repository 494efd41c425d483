import { execFileSync } from "node:child_process";
import { defineConfig } from "@playwright/test";

// Debian's Chromium (no browser downloads here). Each server is the production build on a fresh
// demo database of its own: SQLite for every journey, PostgreSQL (a shorter demo) for the load test.
// Their own ports: a free one chosen once by the runner (workers inherit it through the environment),
// so the journeys never collide with the app the README starts on 3100.
function freePort(): string {
  const script =
    "const s=require('net').createServer();s.listen(0,'127.0.0.1',()=>{process.stdout.write(String(s.address().port));s.close()})";
  return execFileSync(process.execPath, ["-e", script], { encoding: "utf8" }).trim();
}
process.env.E2E_PORT ??= freePort();
process.env.E2E_PG_PORT ??= freePort();
const port = Number(process.env.E2E_PORT);
const pgPort = Number(process.env.E2E_PG_PORT);
const withPg = process.env.E2E_PG !== "0";

export default defineConfig({
  testDir: "e2e",
  workers: 1,
  timeout: 120_000,
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
    { name: "sqlite", use: { baseURL: `http://127.0.0.1:${port}` } },
    ...(withPg
      ? [
          {
            name: "postgresql",
            testMatch: /concurrent-draws\.spec\.ts/,
            use: { baseURL: `http://127.0.0.1:${pgPort}` },
          },
        ]
      : []),
  ],
  webServer: [
    {
      command: `bash scripts/e2e-server.sh ${port} sqlite`,
      url: `http://127.0.0.1:${port}/login`,
      timeout: 600_000,
      reuseExistingServer: false,
      stdout: "pipe",
    },
    ...(withPg
      ? [
          {
            command: `bash scripts/e2e-server.sh ${pgPort} postgresql`,
            url: `http://127.0.0.1:${pgPort}/login`,
            timeout: 600_000,
            reuseExistingServer: false,
            stdout: "pipe" as const,
          },
        ]
      : []),
  ],
});
