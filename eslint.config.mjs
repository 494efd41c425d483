// Lint: typescript-eslint's type-checked recommended rules plus the layer rules of the house style.
// Pure modules (lib/<domain>/<thing>.ts without a role suffix) may not touch Prisma, Next, the clock or
// randomness; only stores (*.store.ts) and the database folder may import the generated client.
import tseslint from "typescript-eslint";

const prismaImports = {
  patterns: [
    {
      group: ["@/lib/generated/*", "**/generated/*", "@prisma/*"],
      message: "Only stores (*.store.ts) and lib/database may use Prisma.",
    },
  ],
};
const frameworkImports = {
  patterns: [
    ...prismaImports.patterns,
    {
      group: ["next", "next/*", "react", "react-dom"],
      message: "Pure lib modules take data in and give data out; no framework imports.",
    },
    {
      group: ["server-only", "@/lib/core/db", "**/*.store", "**/*.service"],
      message: "Pure lib modules may not reach stores, services or the database.",
    },
  ],
};

// Pure modules take `now` (and any random choice) as arguments so they are testable and replayable.
const clockMessage =
  "Pure lib modules do not read the clock or random numbers: pass now in (or the value) as an argument.";
const clockSyntax = [
  { selector: "NewExpression[callee.name='Date'][arguments.length=0]", message: clockMessage },
  { selector: "CallExpression[callee.object.name='Date'][callee.property.name='now']", message: clockMessage },
  { selector: "CallExpression[callee.name='Date']", message: clockMessage },
  { selector: "MemberExpression[object.name='Math'][property.name='random']", message: clockMessage },
  { selector: "MemberExpression[object.name='performance'][property.name='now']", message: clockMessage },
];
const rawQuerySyntax = {
  selector: "CallExpression[callee.property.name='$queryRawUnsafe'][arguments.length>1]",
  message: "Pass user values only through tagged $queryRaw, never $queryRawUnsafe parameters.",
};

// Files under lib/ without a role suffix that do I/O by design (connections, backups), so the clock rule
// does not apply to them. Today no other file needs an exception; add one here with its reason.
const ioFiles = [
  "lib/database/**",
  "lib/core/db.ts",
  "lib/core/connect.ts",
  "lib/core/faults.ts",
  "lib/core/bulk-insert.ts",
];

export default tseslint.config(
  {
    ignores: [
      "node_modules/**",
      ".next/**",
      ".next-*/**",
      ".tmp/**",
      "lib/generated/**",
      "lib/api/client/openapi-types.ts",
      "prisma/pg/**",
      "test-results/**",
      "playwright-report/**",
      "next-env.d.ts",
    ],
  },
  ...tseslint.configs.recommendedTypeChecked,
  {
    languageOptions: { parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname } },
    rules: {
      "@typescript-eslint/consistent-type-imports": "error",
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "@typescript-eslint/no-floating-promises": "error",
      // Server actions and async handlers are passed to React's form/action props, which accept promises.
      "@typescript-eslint/no-misused-promises": ["error", { checksVoidReturn: { attributes: false } }],
      // Async functions without await are deliberate where an interface wants a promise (async server
      // components, fakes standing in for browser APIs in tests); the promise rules above catch the real bugs.
      "@typescript-eslint/require-await": "off",
      "no-restricted-syntax": ["error", rawQuerySyntax],
    },
  },
  { files: ["**/*.mjs", "**/*.cjs", "**/*.js"], ...tseslint.configs.disableTypeChecked },
  {
    // vitest's asymmetric matchers (expect.any, expect.stringContaining) and Object.values over interfaces are typed any;
    // and in fixtures an assertion often steers inference (`null as unknown`), which the assertion rule misreads as unneeded.
    files: ["test/**/*.ts", "e2e/**/*.ts", "seeds/**/*.ts"],
    rules: {
      "@typescript-eslint/no-unnecessary-type-assertion": "off",
      "@typescript-eslint/no-unsafe-assignment": "off",
      "@typescript-eslint/no-unsafe-member-access": "off",
      "@typescript-eslint/no-unsafe-argument": "off",
      "@typescript-eslint/no-unsafe-return": "off",
      "@typescript-eslint/no-unsafe-call": "off",
    },
  },
  {
    files: ["lib/**/*.ts"],
    ignores: [
      "lib/**/*.store.ts",
      "lib/**/*.service.ts",
      "lib/database/**",
      "lib/core/db.ts",
      "lib/core/connect.ts",
      "lib/core/faults.ts",
    ],
    rules: { "no-restricted-imports": ["error", frameworkImports] },
  },
  {
    files: ["lib/**/*.ts"],
    ignores: ["lib/**/*.store.ts", "lib/**/*.service.ts", ...ioFiles],
    rules: { "no-restricted-syntax": ["error", rawQuerySyntax, ...clockSyntax] },
  },
  {
    files: ["app/**/*.ts", "app/**/*.tsx", "lib/**/*.service.ts"],
    rules: {
      "no-restricted-imports": ["error", prismaImports],
      // Services run transactions but leave the queries to stores: no tx.<model>.<call>() or db.<model>.<call>() here.
      "no-restricted-syntax": [
        "error",
        {
          selector: "CallExpression[callee.object.object.name=/^(tx|db)$/][callee.object.property.name!=/^\\$/]",
          message: "Only stores (*.store.ts) query the database; call a store function.",
        },
      ],
    },
  },
);
