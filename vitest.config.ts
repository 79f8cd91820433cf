import { defineConfig } from "vitest/config";

const common = {
  globalSetup: ["tests/setup/global.ts"],
  testTimeout: 30_000,
  hookTimeout: 60_000,
  pool: "forks" as const,
  env: { NODE_ENV: "test" },
};

export default defineConfig({
  test: {
    reporters: ["default", "./tests/setup/count-reporter.ts"],
    projects: [
      { test: { ...common, name: "main", include: ["tests/**/*.test.ts"], exclude: ["tests/**/*.serial.test.ts"] } },
      // Files that change lab-wide state run alone, after everything else.
      { test: { ...common, name: "serial", include: ["tests/**/*.serial.test.ts"], fileParallelism: false, sequence: { groupOrder: 1 } } },
    ],
  },
});
