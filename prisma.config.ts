import { defineConfig } from "prisma/config";

// Only `prisma generate` uses this; migrations run in-process (prisma/migrate.ts).
export default defineConfig({
  schema: "prisma/schema.prisma",
  migrations: { path: "prisma/migrations" },
});
