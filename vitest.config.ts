import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    environment: "node",
    setupFiles: ["tests/setup.ts"],
    testTimeout: 30_000,
    hookTimeout: 300_000,
    projects: [
      {
        extends: true,
        test: { name: "unit", include: ["tests/scaling/**/*.test.ts", "tests/db/**/*.test.ts", "tests/lib/**/*.test.ts"] },
      },
      {
        // Route tests: real HTTP against one `next start` on a temporary SQLite file (tests/helpers/server-setup.ts).
        extends: true,
        test: {
          name: "http",
          include: ["tests/app/**/*.test.ts"],
          globalSetup: ["tests/helpers/server-setup.ts"],
          fileParallelism: false,
        },
      },
    ],
  },
});
