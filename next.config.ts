import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // Native argon2 binding and the database driver stay on the server, loaded by Node at run time.
  serverExternalPackages: ["@node-rs/argon2", "postgres"],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
