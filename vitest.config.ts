import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

const r = (p: string) => fileURLToPath(new URL(p, import.meta.url));

// Three layers, one runner: `npm test` runs them in order against a throwaway database and the built app.
export default defineConfig({
  resolve: {
    alias: {
      "@/": r("./src/"),
      "@sim/": r("./sim/"),
      "@db/": r("./db/"),
      "@workers/": r("./workers/"),
      "server-only": r("./tests/helpers/empty.ts"),
    },
  },
  test: {
    projects: [
      {
        extends: true,
        // Engine properties over the demos run whole Monte Carlo iterations: a guard against hangs, not a speed check.
        test: { name: "unit", include: ["tests/unit/**/*.test.ts", "sim/**/*.test.ts"], environment: "node", testTimeout: 60_000 },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          setupFiles: ["tests/e2e/setup.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 120_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
