// Lint: typescript-eslint's recommended rules plus the layer rule of the house style.
// Pure modules (lib/<domain>/<thing>.ts without a role suffix) may not touch Prisma, Next or the clock's
// owners; only stores (*.store.ts) and the database folder may import the generated client.
import tseslint from "typescript-eslint";

const prismaImports = {
  patterns: [
    { group: ["@/lib/generated/*", "**/generated/*", "@prisma/*"], message: "Only stores (*.store.ts) and lib/database may use Prisma." },
  ],
};
const frameworkImports = {
  patterns: [
    ...prismaImports.patterns,
    { group: ["next", "next/*", "react", "react-dom"], message: "Pure lib modules take data in and give data out; no framework imports." },
    { group: ["server-only", "@/lib/db", "**/*.store", "**/*.service"], message: "Pure lib modules may not reach stores, services or the database." },
  ],
};

export default tseslint.config(
  { ignores: ["node_modules/**", ".next/**", ".next-*/**", ".tmp/**", "lib/generated/**", "prisma/pg/**", "test-results/**", "playwright-report/**", "next-env.d.ts"] },
  ...tseslint.configs.recommended,
  {
    rules: {
      "@typescript-eslint/consistent-type-imports": "error",
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "no-restricted-syntax": ["error", { selector: "CallExpression[callee.property.name='$queryRawUnsafe'][arguments.length>1]", message: "Pass user values only through tagged $queryRaw, never $queryRawUnsafe parameters." }],
    },
  },
  {
    files: ["lib/**/*.ts"],
    ignores: ["lib/**/*.store.ts", "lib/**/*.service.ts", "lib/database/**", "lib/db.ts"],
    rules: { "no-restricted-imports": ["error", frameworkImports] },
  },
  {
    files: ["app/**/*.ts", "app/**/*.tsx", "lib/**/*.service.ts"],
    rules: {
      "no-restricted-imports": ["error", prismaImports],
      // Services run transactions but leave the queries to stores: no tx.<model>.<call>() or db.<model>.<call>() here.
      "no-restricted-syntax": [
        "error",
        { selector: "CallExpression[callee.object.object.name=/^(tx|db)$/][callee.object.property.name!=/^\\$/]", message: "Only stores (*.store.ts) query the database; call a store function." },
      ],
    },
  },
);
