/** @type {import('next').NextConfig} */
const nextConfig = {
  reactStrictMode: true,
  // A second working copy of the build output for parallel dev servers (NEXT_DIST_DIR=.next-<name>).
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  poweredByHeader: false,
  serverExternalPackages: ["@prisma/adapter-better-sqlite3", "@prisma/adapter-pg", "better-sqlite3", "pg", "highs"],
  turbopack: { root: import.meta.dirname },
  // forbidden(): a page a role may not read answers 403 with app/forbidden.tsx (lib/auth/read-matrix.ts).
  experimental: { authInterrupts: true },
};

export default nextConfig;
