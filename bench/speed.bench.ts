import { execFileSync, spawn } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import pg from "pg";
import { LOCAL_APP_ROLE, LOCAL_OWNER_ROLE } from "../server/config";
import { DEFAULT_GRID } from "../shared/schemas/bounds";
import { smallestSupportingBase } from "../server/engine/base-search";
import { DYNAMIC_BROTLI_QUALITY, DYNAMIC_GZIP_LEVEL } from "../server/platform/prepared-json";
import { everyMethodQuestion } from "./analysis-question";
import { HAMMER_N, HAMMER_WARM, hammer, loadNow, median, send, signIn, type Hammered } from "./http-client";
import { freePort, startProductionApp, waitFor } from "./production-app";

// The figures of the speed table, each as a ratio against a baseline measured in the same run:
//  - smallest-base search over HTTP (a fresh computation) against the same search in-process;
//  - a repeated question (a kept answer) against the in-process search;
//  - JavaScript the first page pulls, bytes on the wire against the uncompressed bytes; immutable caching of hashed files;
//  - POST /api/analyses at 50 connections against a bare Express route answering the same JSON, compressed the same
//    way, with the CPU each request cost the server, its database backends and the load generator.
// The app runs as production runs it (`npm start`, compiled, NODE_ENV=production) in a child process on the loopback
// cluster's `ropewalk` database; BENCH_URL=http://host:port measures an already running instance instead (kept
// answers are then not cleared between fresh searches). Demo accounts must exist there (RW_SEED).

const root = path.resolve(import.meta.dirname, "..");
const DEMO = { email: "researcher@ropewalk.test", password: "ropewalk-demo" };
const FRESH_RUNS = 3;

function startApp(pgPort: string) {
  execFileSync("bash", [path.join(root, "docker-free-db-scripts/start.sh"), "ropewalk"], {
    stdio: ["ignore", "ignore", "inherit"],
  });
  return startProductionApp({
    databaseUrl: `postgres://${LOCAL_APP_ROLE}@127.0.0.1:${pgPort}/ropewalk`,
    migrationUrl: `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${pgPort}/ropewalk`,
    seed: true,
    tries: 600,
  });
}

async function startBareJson(body: Buffer) {
  const file = path.join(os.tmpdir(), `ropewalk-bench-body-${process.pid}.json`);
  fs.writeFileSync(file, body);
  const port = await freePort();
  const levels = [String(DYNAMIC_GZIP_LEVEL), String(DYNAMIC_BROTLI_QUALITY)];
  const child = spawn("node", [path.join(root, "bench/bare-json-server.mjs"), String(port), file, ...levels], {
    cwd: root,
    stdio: ["ignore", "ignore", "inherit"],
  });
  const base = `http://127.0.0.1:${port}`;
  await waitFor(base, child, 600);
  // the server has read the body by the time it answers
  fs.rmSync(file, { force: true });
  return { base, child };
}

const ratio = (x: number, baseline: number) => `${(x / baseline).toFixed(2)}×`;
const line = (label: string, figure: string, vs: string) =>
  console.log(`  ${label.padEnd(52)} ${figure.padEnd(34)} ${vs}`);

export async function runSpeedBench() {
  const pgPort = process.env.PGPORT ?? "54329";
  const external = process.env.BENCH_URL;
  const app = external ? { base: external, child: null } : await startApp(pgPort);
  // The owner role also reads pg_stat_activity for the app's backends, whose CPU the load runs count.
  const owner = external
    ? null
    : new pg.Pool({ connectionString: `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${pgPort}/ropewalk`, max: 1 });
  const forget = async () => void (await owner?.query("DELETE FROM base_search_results"));
  try {
    // Behind a TLS proxy as in production: the session cookie is Secure, so say the request came over https.
    const headers = await signIn(app.base, DEMO.email, DEMO.password, { "x-forwarded-proto": "https" });
    const post = (p: string, body: unknown, extra: Record<string, string> = {}) =>
      send(`${app.base}${p}`, { method: "POST", headers: { ...headers, ...extra }, body: JSON.stringify(body) });

    console.log(`\nSpeed table (${external ? external : "npm start, compiled, NODE_ENV=production"})`);
    await post("/api/bounds/base", { rotaryDim: 64, targetContext: 4096 }); // first thread, first connection
    for (const target of [32_768, 1_048_576]) {
      const question = { rotaryDim: 128, targetContext: target };
      const engine: number[] = [];
      for (let i = 0; i < FRESH_RUNS; i++) {
        const t = performance.now();
        smallestSupportingBase(128, target, DEFAULT_GRID);
        engine.push(performance.now() - t);
      }
      const http: number[] = [];
      for (let i = 0; i < FRESH_RUNS; i++) {
        await forget();
        const r = await post("/api/bounds/base", question);
        if (r.status !== 200) throw new Error(`search answered ${r.status}`);
        http.push(r.ms);
      }
      line(
        `smallest base, d = 128, L = ${target}, fresh, HTTP`,
        `median ${median(http).toFixed(0)} ms`,
        `${ratio(median(http), median(engine))} the in-process engine (${median(engine).toFixed(0)} ms)`,
      );
      if (target === 1_048_576) {
        const again: number[] = [];
        for (let i = 0; i < 20; i++) again.push((await post("/api/bounds/base", question)).ms);
        line(
          `same question again (L = ${target})`,
          `median ${median(again).toFixed(1)} ms`,
          `${ratio(median(again), median(engine))} the in-process engine`,
        );
      }
    }

    // First page: the script and the module preloads index.html names, as a browser accepting br fetches them.
    const html = (await send(`${app.base}/signin`, { headers: { "accept-encoding": "identity" } })).body.toString();
    const js = [...html.matchAll(/<(?:script[^>]*src|link[^>]*rel="modulepreload"[^>]*href)="([^"]+\.js)"/g)].map(
      (m) => m[1],
    );
    let rawBytes = 0;
    let wireBytes = 0;
    for (const src of js) {
      rawBytes += (await send(`${app.base}${src}`, { headers: { "accept-encoding": "identity" } })).body.length;
      wireBytes += (await send(`${app.base}${src}`, { headers: { "accept-encoding": "br, gzip" } })).body.length;
    }
    line(
      `JavaScript of the first page (${js.length} files)`,
      `${(wireBytes / 1024).toFixed(0)} kB on the wire`,
      `${ratio(wireBytes, rawBytes)} uncompressed (${(rawBytes / 1024).toFixed(0)} kB)`,
    );
    const assets = [...html.matchAll(/(?:src|href)="(\/assets\/[^"]+)"/g)].map((m) => m[1]);
    let immutable = 0;
    for (const a of assets)
      if (/immutable/.test(String((await send(`${app.base}${a}`)).headers["cache-control"]))) immutable++;
    const indexCache = (await send(`${app.base}/`)).headers["cache-control"] ?? "none";
    line(`hashed assets cached immutably`, `${immutable} of ${assets.length}`, `index.html: ${indexCache}`);

    // POST /api/analyses with the 8 methods at 50 connections, each form against a bare Express route answering the
    // same JSON the same way (gzip through the `compression` middleware at the app's levels).
    const analysis = everyMethodQuestion();
    // Three ways of asking: the row form with a new question each time (every answer computed: what every request
    // cost before answers were kept and the column form existed), the column form with new questions, and the
    // column form asked the same question again (a kept answer).
    let asked = 0;
    const fresh = () => ({ ...analysis, targetContext: analysis.targetContext + ++asked });
    const columns = (q: object) => ({ ...q, form: "columns" });
    const rowsRaw = await post("/api/analyses", fresh(), { "accept-encoding": "identity" });
    const rowsZip = await post("/api/analyses", fresh(), { "accept-encoding": "gzip" });
    const colsRaw = await post("/api/analyses", columns(fresh()), { "accept-encoding": "identity" });
    const colsZip = await post("/api/analyses", columns(fresh()), { "accept-encoding": "gzip" });
    const gz = { "accept-encoding": "gzip" };
    const url = `${app.base}/api/analyses`;
    const appCpu = () => ({ pid: app.child?.pid, pool: owner });
    const rowsFresh = await hammer(url, { ...headers, ...gz }, () => JSON.stringify(fresh()), appCpu());
    const colsFresh = await hammer(url, { ...headers, ...gz }, () => JSON.stringify(columns(fresh())), appCpu());
    const keptBody = JSON.stringify(columns(analysis));
    const colsKept = await hammer(url, { ...headers, ...gz }, keptBody, appCpu());
    const baseline = async (answer: Buffer) => {
      const bare = await startBareJson(answer);
      try {
        // no session, database or engine: the request body is parsed and dropped, the answer re-serialised each time
        const json = { "content-type": "application/json", ...gz };
        return await hammer(`${bare.base}/api/analyses`, json, JSON.stringify(analysis), { pid: bare.child.pid });
      } finally {
        bare.child.kill("SIGTERM");
      }
    };
    const bareRows = await baseline(rowsRaw.body);
    const bareCols = await baseline(colsRaw.body);
    const figure = (r: Hammered) =>
      `${r.rps.toFixed(0)} req/s, p99 ${r.p99.toFixed(0)} ms${r.failed ? ` (not 200: ${r.failed})` : ""}`;
    const vsBare = (r: Hammered, bare: Hammered, form: string) =>
      `${ratio(r.rps, bare.rps)} the req/s of a bare Express JSON route (${form}: ${bare.rps.toFixed(0)} req/s, p99 ${bare.p99.toFixed(0)} ms)`;
    const n = analysis.methods.length;
    console.log(`  (autocannon, 50 connections, ${HAMMER_WARM} requests to warm up, then ${HAMMER_N}; ${loadNow()})`);
    line(
      `POST /api/analyses (${n} methods), rows, each new, 50 conn.`,
      figure(rowsFresh),
      vsBare(rowsFresh, bareRows, "rows"),
    );
    line(`  columns, each new`, figure(colsFresh), vsBare(colsFresh, bareCols, "columns"));
    line(`  columns, asked again (kept answer)`, figure(colsKept), vsBare(colsKept, bareCols, "columns"));
    const cpu = (r: Hammered) =>
      `server ${r.cpu.server.toFixed(2)}, database ${r.cpu.db.toFixed(2)}, load generator ${r.cpu.client.toFixed(2)}`;
    line(`  CPU ms per request, rows, each new`, cpu(rowsFresh), `bare route, rows: ${cpu(bareRows)}`);
    line(`  CPU ms per request, columns, each new`, cpu(colsFresh), `bare route, columns: ${cpu(bareCols)}`);
    line(`  CPU ms per request, columns, asked again`, cpu(colsKept), "");
    const kB = (b: Buffer) => `${(b.length / 1024).toFixed(0)} kB`;
    line(`  its answer, rows`, `${kB(rowsRaw.body)} JSON, ${kB(rowsZip.body)} gzip`, "the default form");
    line(
      `  its answer, columns`,
      `${kB(colsRaw.body)} JSON, ${kB(colsZip.body)} gzip`,
      `${ratio(colsRaw.body.length, rowsRaw.body.length)} the rows (${ratio(colsZip.body.length, rowsZip.body.length)} gzipped)`,
    );
  } finally {
    await owner?.end();
    app.child?.kill("SIGTERM");
  }
}
