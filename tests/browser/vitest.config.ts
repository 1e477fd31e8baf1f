import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

// Browser tests: run by scripts/browser-tests.ts, which starts the app and sets
// STOKELINE_BASE_URL and CHROME_PATH. One file at a time: they share one server.
const root = fileURLToPath(new URL("../..", import.meta.url));

export default defineConfig({
  root,
  resolve: { alias: [{ find: /^@\//, replacement: root }] },
  test: {
    environment: "node",
    include: ["tests/browser/**/*.test.ts"],
    testTimeout: 60000,
    hookTimeout: 60000,
    fileParallelism: false,
    pool: "forks",
  },
});
