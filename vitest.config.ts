import { defineConfig } from "vitest/config";

// Kept apart from vite.config.ts so that the React Router plugin never loads in tests.
export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: "unit",
          include: ["app/**/*.test.ts", "db/**/*.test.ts", "scripts/**/*.test.ts"],
          environment: "node",
          setupFiles: ["tests/setup/fail-on-console-error.ts"],
          // Some reference integrals (e.g. a strongly peaked dσ/dΩ at γ = 1000) take seconds
          // on a loaded 2-core machine; a time limit is not an accuracy bound.
          testTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          // The files share the running app and its storage folder: one at a time.
          fileParallelism: false,
          setupFiles: ["tests/setup/fail-on-console-error.ts"],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          setupFiles: ["tests/setup/fail-on-console-error.ts"],
          fileParallelism: false,
          testTimeout: 90_000,
          hookTimeout: 180_000,
        },
      },
    ],
  },
});
