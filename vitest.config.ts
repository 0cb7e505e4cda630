import { defineConfig } from "vitest/config";
import path from "node:path";

const alias = {
  "~": path.resolve(import.meta.dirname, "app"),
  "@shared": path.resolve(import.meta.dirname, "shared"),
};

// Suites by layer; `npm test` runs them through scripts/test.ts with a live database and stand-ins.
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      { resolve: { alias }, test: { name: "unit", include: ["tests/unit/**/*.test.{ts,tsx}"], environment: "node", testTimeout: 30_000 } },
      {
        resolve: { alias },
        test: { name: "reference", include: ["tests/reference/**/*.test.ts"], environment: "node", testTimeout: 60_000 },
      },
      {
        resolve: { alias },
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 90_000,
          hookTimeout: 90_000,
        },
      },
    ],
  },
});
