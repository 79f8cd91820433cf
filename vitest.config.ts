import { defineConfig } from "vitest/config";
import { alias } from "./vite.config";

/*
 * Three layers, assigned by folder so a new test file lands in the right one without touching this file:
 *   unit  tests/unit             no PostgreSQL, no Chromium (no global setup at all): `npm run test:unit`
 *   api   tests/api, tests/scripts   a migrated PostgreSQL database made for the run: `npm run test:api`
 *   e2e   tests/e2e              PostgreSQL and Chromium, the built client in dist/: `npm run test:e2e`
 * Files ending in .serial.test.ts change lab-wide state; each layer keeps them in its own "-serial"
 * project, which runs one file at a time after every other project (sequence.groupOrder).
 */
const SERIAL = "**/*.serial.test.ts";
const base = { testTimeout: 30_000, hookTimeout: 60_000, pool: "forks" as const, env: { NODE_ENV: "test" } };
const DB = "tests/setup/global-db.ts";
const BROWSER_SETUP = "tests/setup/global-browser.ts";

/*
 * Browser tests get one second try on CI (CI=true), where a shared machine can be slow enough to expose a timing race
 * the test itself has; the count reporter names every test that passed only on its second try, so a race is seen
 * and mended, not hidden. Unit and api tests never retry. Their expect.poll waits up to 15 s for what the page will
 * show (Vitest's default is 1 s, shorter than a busy machine's refetch and redraw).
 */
const BROWSER = {
  retry: process.env.CI === "true" ? 1 : 0,
  expect: { poll: { timeout: 15_000 } },
};

type LayerOptions = Partial<typeof BROWSER>;

function layer(
  name: string,
  folders: string[],
  globalSetup: string[],
  serialOrder: number,
  options: LayerOptions = {},
) {
  const include = folders.map((f) => `${f}/**/*.test.{ts,tsx}`);
  return [
    { resolve: { alias }, test: { ...base, ...options, name, include, exclude: [SERIAL], globalSetup } },
    {
      resolve: { alias },
      test: {
        ...base,
        ...options,
        name: `${name}-serial`,
        include: folders.map((f) => `${f}/${SERIAL}`),
        globalSetup,
        fileParallelism: false,
        sequence: { groupOrder: serialOrder },
      },
    },
  ];
}

export default defineConfig({
  test: {
    reporters: ["default", "./tests/setup/count-reporter.ts"],
    projects: [
      ...layer("unit", ["tests/unit"], [], 1),
      ...layer("api", ["tests/api", "tests/scripts"], [DB], 2),
      ...layer("e2e", ["tests/e2e"], [DB, BROWSER_SETUP], 3, BROWSER),
    ],
  },
});
