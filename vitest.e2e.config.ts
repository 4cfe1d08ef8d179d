import { defineConfig } from "vitest/config";

// Browser tests: playwright-core driving Debian's chromium against a real `next start`.
export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    environment: "node",
    include: ["tests/e2e/**/*.test.ts"],
    setupFiles: ["tests/setup.ts"],
    globalSetup: ["tests/helpers/server-setup.ts"],
    fileParallelism: false,
    testTimeout: 120_000,
    hookTimeout: 300_000,
  },
});
