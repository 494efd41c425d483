import path from "node:path";
import { defineConfig } from "vitest/config";

// "server-only" throws outside React's server build; tests run stores directly, so it becomes a no-op here.
const alias = {
  "@": path.resolve(import.meta.dirname, "."),
  "server-only": path.resolve(import.meta.dirname, "test/support/server-only.ts"),
};

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: { name: "unit", environment: "node", include: ["test/unit/**/*.test.ts"] },
      },
      {
        resolve: { alias },
        test: {
          name: "integration",
          environment: "node",
          include: ["test/integration/**/*.test.ts"],
          pool: "forks",
          testTimeout: 60000,
          hookTimeout: 120000,
        },
      },
    ],
  },
});
