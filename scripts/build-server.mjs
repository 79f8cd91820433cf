// Builds the server into dist/server: one ESM bundle for `npm start` (scripts/start.ts, which starts server/index.ts)
// and one file per worker-thread task, so production runs compiled JavaScript and never loads TypeScript through tsx.
// Packages stay external (node_modules is there at run time); only our own server/ and shared/ code is bundled.
// `node scripts/build-server.mjs` builds; scripts/launch.mjs calls buildServerIfStale() on every start.
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "esbuild";
import { newestMtime } from "./newest-mtime.mjs";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
export const SERVER_OUT = path.join(root, "dist/server");
export const SERVER_ENTRY = path.join(SERVER_OUT, "start.js");

// Worker tasks sit beside the bundle: server/platform/worker-entry.ts loads `./<name>.js` next to the running module.
const entryPoints = [
  { in: "scripts/start.ts", out: "start" },
  { in: "server/features/bounds/bounds.worker.ts", out: "bounds.worker" },
  { in: "server/features/analyses/analyses.worker.ts", out: "analyses.worker" },
];
const SOURCES = ["server", "shared", "scripts", "package-lock.json", "tsconfig.json"];

export function serverBuildIsStale() {
  if (!fs.existsSync(SERVER_ENTRY)) return true;
  const built = fs.statSync(SERVER_ENTRY).mtimeMs;
  return SOURCES.some((s) => newestMtime(path.join(root, s)) > built);
}

export async function buildServer() {
  fs.rmSync(SERVER_OUT, { recursive: true, force: true });
  await build({
    absWorkingDir: root,
    entryPoints,
    outdir: SERVER_OUT,
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    packages: "external",
    sourcemap: true,
    // Bundled modules keep their import.meta.url (the bundle's); a few CommonJS-only packages need require().
    banner: {
      js: 'import { createRequire as __rwRequire } from "node:module"; const require = __rwRequire(import.meta.url);',
    },
    logLevel: "warning",
  });
}

export async function buildServerIfStale() {
  if (!serverBuildIsStale()) return false;
  console.log("Building the server (missing or older than its sources)…");
  await buildServer();
  return true;
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) await buildServer();
