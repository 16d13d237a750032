import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // Native argon2 binding, the database driver and the job queue (with its own driver) stay on the server, loaded by Node at run time.
  serverExternalPackages: ["@node-rs/argon2", "postgres", "pg-boss", "pg"],
  poweredByHeader: false,
  // `npm test` builds into its own folder, so a test run never disturbs the app `npm start` serves.
  distDir: process.env.POURLINE_DIST_DIR ?? ".next",
  typedRoutes: false,
};

export default nextConfig;
