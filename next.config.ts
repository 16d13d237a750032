import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // Native argon2 binding, the database driver and the job queue (with its own driver) stay on the server, loaded by Node at run time;
  // so do drizzle and its session adapter, which the reads scripts/serve.mjs answers itself load too — one copy in the process.
  serverExternalPackages: ["@node-rs/argon2", "postgres", "pg-boss", "pg", "drizzle-orm", "@lucia-auth/adapter-drizzle"],
  poweredByHeader: false,
  // `npm test` builds into its own folder, so a test run never disturbs the app `npm start` serves.
  distDir: process.env.POURLINE_DIST_DIR ?? ".next",
  typedRoutes: false,
  // POURLINE_SOURCE_MAPS=1 (profiling only): browser source maps, so a page's profile names our functions.
  productionBrowserSourceMaps: process.env.POURLINE_SOURCE_MAPS === "1",
  // forbidden(): a member whose role may not open a page gets 403 and the role-refusal page, not "not found".
  experimental: { authInterrupts: true },
};

export default nextConfig;
