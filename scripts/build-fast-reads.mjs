#!/usr/bin/env node
// Bundles src/lib/server/fast-reads.ts (the two reads scripts/serve.mjs answers before Next.js) into the build
// folder as pourline-fast-reads.mjs, after `next build`. Our own modules are bundled; packages stay imports of
// node_modules (one copy of the database driver and drizzle in the process, shared with the app's build).
// `server-only` is the exception: it is a marker that throws outside React's server build, and this bundle is
// server code by construction. The file's name is also in scripts/serve.mjs (which loads it) and
// scripts/pourline.mjs (which builds it when missing); neither imports this script, which needs esbuild.
import { build } from "esbuild";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";

const root = resolve(dirname(fileURLToPath(import.meta.url)), "..");
const distDir = process.env.POURLINE_DIST_DIR ?? ".next";

await build({
  entryPoints: [join(root, "src/lib/server/fast-reads.ts")],
  outfile: join(root, distDir, "pourline-fast-reads.mjs"),
  bundle: true,
  platform: "node",
  format: "esm",
  target: "node20",
  packages: "external",
  tsconfig: join(root, "tsconfig.json"),
  logLevel: "warning",
  plugins: [
    {
      name: "server-only-marker",
      setup(b) {
        b.onResolve({ filter: /^server-only$/ }, () => ({ path: "server-only", namespace: "empty" }));
        b.onLoad({ filter: /.*/, namespace: "empty" }, () => ({ contents: "" }));
      },
    },
    {
      // Next's entry points (next/server, next/headers) are CommonJS files without an exports map, which
      // Node's ESM loader finds only by their full file name.
      name: "next-entry-files",
      setup(b) {
        b.onResolve({ filter: /^next\/[a-z-]+$/ }, (args) => ({ path: `${args.path}.js`, external: true }));
      },
    },
  ],
});
