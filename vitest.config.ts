import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

const root = fileURLToPath(new URL(".", import.meta.url));

export default defineConfig({
  resolve: {
    alias: [
      { find: /^@\//, replacement: root },
      // "server-only" throws outside React's server build; in Node tests it is a no-op.
      { find: /^server-only$/, replacement: `${root}tests/support/server-only-stub.ts` },
    ],
  },
  test: {
    environment: "node",
    include: ["tests/**/*.test.ts"],
    exclude: ["tests/browser/**", "node_modules/**"],
    testTimeout: 30000,
    hookTimeout: 60000,
    pool: "forks",
  },
});
