import { defineConfig } from "vitest/config";

// The React Router Vite plugin stays out of Vitest (it expects a dev server).
const shared = { resolve: { tsconfigPaths: true } } as const;

export default defineConfig({
  ...shared,
  test: {
    projects: [
      { ...shared, test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node" } },
      {
        ...shared,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          setupFiles: ["tests/setup/no-console-error.ts"],
          testTimeout: 20_000,
        },
      },
      {
        ...shared,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
