import { defineConfig } from "@playwright/test";

// Debian's Chromium (no browser downloads here). Each server is the production build on a fresh
// demo database of its own: SQLite for every journey, PostgreSQL (a shorter demo) for the load test.
const port = Number(process.env.E2E_PORT ?? 3100);
const pgPort = port + 1;
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
      args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    },
  },
  projects: [
    { name: "sqlite", use: { baseURL: `http://127.0.0.1:${port}` } },
    ...(withPg ? [{ name: "postgresql", testMatch: /concurrent-draws\.spec\.ts/, use: { baseURL: `http://127.0.0.1:${pgPort}` } }] : []),
  ],
  webServer: [
    { command: `bash scripts/e2e-server.sh ${port} sqlite`, url: `http://127.0.0.1:${port}/login`, timeout: 180_000, reuseExistingServer: false, stdout: "pipe" },
    ...(withPg ? [{ command: `bash scripts/e2e-server.sh ${pgPort} postgresql`, url: `http://127.0.0.1:${pgPort}/login`, timeout: 240_000, reuseExistingServer: false, stdout: "pipe" as const }] : []),
  ],
});
