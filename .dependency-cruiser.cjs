// Import rules for lib/, checked by `npm run deps:check` (a step of scripts/test-all.sh, after lint).
// See docs/decisions/0038-import-rules.md.

// The shared kernel every domain writes through: the ledger (postMovement, runInTransaction, holders)
// and the audit chain (appendAudit), and the site record itself (name, time zone, settings every
// report and label carries). Their stores are meant to be imported from any domain.
const KERNEL_STORES = "^lib/(ledger/[^/]+|audit/audit|site/site)\\.store\\.ts$";

// Baseline taken on the day the rule came in: files that reach another domain's store today. Each is
// allowed only the targets listed; any new reach (from these files or any other) fails. Shrink this
// list as stores gain service functions; never grow it.
const KNOWN_STORE_REACHES = {
  "lib/batch/batch.service.ts": [
    "lib/feedstock/lot.store.ts",
    "lib/product/product.store.ts",
    "lib/tank/tank.store.ts",
    "lib/waste/container.store.ts",
  ],
  "lib/batch/plan.store.ts": ["lib/feedstock/lab.store.ts"],
  "lib/correction/correction.service.ts": ["lib/tank/tank.store.ts"],
  "lib/feedstock/lot.service.ts": ["lib/source/source.store.ts"],
  "lib/feedstock/pickup.service.ts": ["lib/source/source.store.ts"],
  "lib/grid/grid.store.ts": ["lib/waste/container.store.ts"],
  "lib/product/certificate.service.ts": ["lib/site/site.store.ts"],
  "lib/shipment/shipment.service.ts": ["lib/customer/customer.store.ts"],
  "lib/trace/trace.service.ts": ["lib/shipment/shipment.store.ts"],
  // Written the same day in parallel with the rule and merged after it; same promise: shrink, never grow.
  "lib/trace/recall.service.ts": ["lib/shipment/shipment.store.ts", "lib/product/product.store.ts"],
  "lib/screening/decision.service.ts": ["lib/feedstock/lot.store.ts"],
};
const escape = (p) => p.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
const exact = (p) => `^${escape(p)}$`;
const otherStore = { path: "^lib/[^/]+/[^/]+\\.store\\.ts$", pathNot: ["^lib/$1/", KERNEL_STORES] };

/** @type {import('dependency-cruiser').IConfiguration} */
module.exports = {
  forbidden: [
    {
      name: "core-stands-alone",
      severity: "error",
      comment: "lib/core is the shared kernel every domain imports; it imports nothing else in lib/.",
      from: { path: "^lib/core/" },
      to: { path: "^lib/", pathNot: ["^lib/core/", "^lib/generated/"] },
    },
    {
      name: "no-cycles-in-lib",
      severity: "error",
      comment:
        "Files in lib/ import one way (type-only imports count too): a cycle means two modules cannot be understood or tested apart.",
      from: { path: "^lib/" },
      to: { circular: true },
    },
    {
      name: "no-other-domains-store",
      severity: "error",
      comment:
        "A domain reaches another domain's data through that domain's service, not its store (the ledger and audit stores are the shared kernel).",
      from: { path: "^lib/([^/]+)/", pathNot: Object.keys(KNOWN_STORE_REACHES).map(exact) },
      to: otherStore,
    },
    ...Object.entries(KNOWN_STORE_REACHES).map(([from, known]) => ({
      name: "no-other-domains-store",
      severity: "error",
      comment: `Baseline: ${from} may keep only the store imports it had when the rule came in.`,
      from: { path: `^lib/(${escape(from.split("/")[1])})/${escape(from.split("/").slice(2).join("/"))}$` },
      to: { ...otherStore, pathNot: [...otherStore.pathNot, ...known.map(exact)] },
    })),
    {
      name: "no-folder-cycles-in-lib",
      severity: "error",
      scope: "folder",
      comment: "lib/ folders (domains) should form a one-way graph.",
      from: { path: "^lib/" },
      to: { circular: true },
    },
  ],
  options: {
    doNotFollow: { path: "node_modules" },
    exclude: { path: "^lib/generated/" },
    tsPreCompilationDeps: true,
    tsConfig: { fileName: "tsconfig.json" },
    enhancedResolveOptions: {
      exportsFields: ["exports"],
      conditionNames: ["import", "require", "node", "default", "types"],
    },
  },
};
