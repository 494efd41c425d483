/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  // A second working copy of the build output for parallel dev servers (NEXT_DIST_DIR=.next-<name>).
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  poweredByHeader: false,
  serverExternalPackages: ["@prisma/adapter-better-sqlite3", "@prisma/adapter-pg", "better-sqlite3", "pg", "highs"],
  turbopack: { root: import.meta.dirname },
  // forbidden(): a page a role may not read answers 403 with app/forbidden.tsx (lib/auth/read-matrix.ts).
  // proxyClientMaxBodySize: the proxy buffers request bodies; the largest route (a grid file import,
  // lib/grid/sheet.ts MAX_IMPORT_BYTES as JSON text) must arrive whole so the route can judge it.
  // NEXT_SERVER_MINIFY=0 keeps the server's function names readable in a CPU profile (APP_CPU_PROF_DIR).
  experimental: {
    authInterrupts: true,
    proxyClientMaxBodySize: "22mb",
    serverMinification: process.env.NEXT_SERVER_MINIFY !== "0",
  },
};

export default nextConfig;
