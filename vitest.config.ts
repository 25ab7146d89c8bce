import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    include: ["packages/*/test/**/*.test.ts", "tests/**/*.test.ts"],
    exclude: ["**/node_modules/**", "tests/bench/**"],
    pool: "forks",
    globalSetup: ["tests/browser/global-setup.ts"],
    testTimeout: 30000,
  },
});
