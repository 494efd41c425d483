// Writes prisma/pg/schema.prisma from prisma/schema.prisma (the only schema file to edit).
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";

const source = readFileSync("prisma/schema.prisma", "utf8");
const swaps = [
  ['provider = "sqlite"', 'provider = "postgresql"'],
  ['output   = "../lib/generated/sqlite"', 'output   = "../../lib/generated/pg"'],
];
let pg = source;
for (const [from, to] of swaps) {
  if (!pg.includes(from)) throw new Error(`gen-schemas: pattern not found in prisma/schema.prisma: ${from}`);
  pg = pg.replace(from, to);
}
mkdirSync("prisma/pg", { recursive: true });
writeFileSync(
  "prisma/pg/schema.prisma",
  `// GENERATED from prisma/schema.prisma by prisma/gen-schemas.mjs. Do not edit.\n${pg}`,
);
