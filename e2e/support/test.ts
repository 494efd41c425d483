// The journeys' `test`: Playwright's, where every test starts on its own fresh demo plant (a copy of
// the demo database served by the built app on a port of its own, plant.ts) and a page fails the test
// on any unexpected console error or uncaught page error. Import { test, expect } from here, not from
// "@playwright/test".
import { expect, test as base } from "@playwright/test";
import type { Plant } from "./plant";
import { PlantPool } from "./plant";

interface Benign {
  pattern: RegExp;
  reason: string;
}

/** Console errors that are expected somewhere in the journeys, each with why it is harmless. */
export const BENIGN_CONSOLE_ERRORS: readonly Benign[] = [
  {
    pattern: /^Failed to load resource: the server responded with a status of 4\d\d\b/,
    reason:
      "journeys visit refused pages and send refused or invalid requests on purpose, and assert the status themselves; Chromium logs each one",
  },
  {
    pattern: /^Failed to load resource: net::ERR_(INTERNET_DISCONNECTED|NETWORK_CHANGED|CONNECTION_REFUSED|FAILED)\b/,
    reason:
      "the phone journeys take the browser offline to prove the outbox keeps entries; the failed sends are logged by Chromium",
  },
];

export interface JourneyOptions {
  /** More benign errors for one file or test: test.use({ allowConsoleErrors: [{ pattern, reason }] }). */
  allowConsoleErrors: Benign[];
  /** A server the project starts for all its tests instead (the PostgreSQL project's). */
  sharedServer: string | undefined;
  /** This test's own demo plant (its address and database file); started only when a test uses it. */
  plant: Plant | null;
}

interface WorkerFixtures {
  plants: PlantPool;
}

export const test = base.extend<JourneyOptions, WorkerFixtures>({
  plants: [
    async ({}, use, workerInfo) => {
      const pool = new PlantPool(workerInfo.workerIndex);
      try {
        await use(pool);
      } finally {
        await pool.close();
      }
    },
    { scope: "worker" },
  ],
  allowConsoleErrors: [[], { option: true }],
  sharedServer: [undefined, { option: true }],
  plant: async ({ sharedServer, plants }, use) => {
    if (sharedServer) return use(null);
    const plant = await plants.take();
    try {
      await use(plant);
    } finally {
      plants.release(plant);
    }
  },
  baseURL: async ({ plant, sharedServer }, use) => {
    await use(plant?.baseURL ?? sharedServer);
  },
  page: async ({ page, allowConsoleErrors }, use, testInfo) => {
    const allowed = [...BENIGN_CONSOLE_ERRORS, ...allowConsoleErrors];
    const unexpected: string[] = [];
    page.on("console", (m) => {
      if (m.type() !== "error") return;
      const text = m.text();
      if (!allowed.some((b) => b.pattern.test(text))) unexpected.push(`console error at ${page.url()}: ${text}`);
    });
    page.on("pageerror", (e) => {
      const text = `${e.name}: ${e.message}`;
      if (!allowed.some((b) => b.pattern.test(text))) unexpected.push(`uncaught error at ${page.url()}: ${text}`);
    });
    await use(page);
    // A test that already failed keeps its own message; the console lines are attached for the reader.
    if (unexpected.length && testInfo.status !== testInfo.expectedStatus) {
      await testInfo.attach("console errors", { body: unexpected.join("\n"), contentType: "text/plain" });
      return;
    }
    expect(
      unexpected,
      "the page logged errors no journey expects (allow one in e2e/support/test.ts with its reason)",
    ).toEqual([]);
  },
});

export { expect };
