// `npm run bench:scale`: list endpoints on a busy lab's year of data (issue 14), in their own database on the loopback
// cluster (ropewalk_bench_scale, kept between runs: seeding takes minutes). Prints p50/p95 per list endpoint and the
// 50-connection throughput of /api/plans. `npm run bench:scale -- --serve PORT` serves the app on that database until
// interrupted (demo accounts, password "ropewalk-demo"). `--reseed` drops and rebuilds the database first.
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { performance } from "node:perf_hooks";
import autocannon from "autocannon";
import pg from "pg";
import { createApp } from "../../server/app";
import { LOCAL_APP_ROLE, LOCAL_OWNER_ROLE, loadConfig } from "../../server/config";
import { createDb } from "../../server/db/client";
import { migrateDatabase } from "../../server/db/migrate";
import { DEMO_PASSWORD, seedDemo } from "../../server/db/seed";
import { quantile, signIn } from "../http-client";

const root = path.resolve(import.meta.dirname, "../..");
const DB = "ropewalk_bench_scale";
const port = process.env.PGPORT ?? "54329";
const ownerUrl = `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${port}/${DB}`;
const args = process.argv.slice(2);
const servePort = args.includes("--serve") ? Number(args[args.indexOf("--serve") + 1]) : undefined;

async function prepare() {
  execFileSync("bash", [path.join(root, "docker-free-db-scripts/start.sh"), "postgres"], {
    stdio: ["ignore", "ignore", "inherit"],
  });
  const admin = new pg.Client({ connectionString: `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${port}/postgres` });
  await admin.connect();
  if (args.includes("--reseed")) await admin.query(`DROP DATABASE IF EXISTS ${DB} WITH (FORCE)`);
  const exists = (await admin.query("SELECT 1 FROM pg_database WHERE datname = $1", [DB])).rowCount;
  if (!exists) await admin.query(`CREATE DATABASE ${DB}`);
  await admin.end();
  const config = loadConfig({
    NODE_ENV: "development",
    LOG_LEVEL: "warn",
    DATABASE_URL: `postgres://${LOCAL_APP_ROLE}@127.0.0.1:${port}/${DB}`,
    LOGIN_LIMIT_PER_ADDRESS: "100000",
  });
  await migrateDatabase(ownerUrl, config.databaseUrl);
  const { pool, db } = createDb(config.databaseUrl, 10);
  const { pool: sessionPool } = createDb(config.databaseUrl, 3);
  const owner = new pg.Client({ connectionString: ownerUrl });
  await owner.connect();
  const plans = Number((await owner.query("SELECT count(*) AS n FROM plans")).rows[0].n);
  if (plans < 100_000) {
    console.log(`seeding ${DB} (demo scenario, then the year's volumes through SQL)…`);
    const t0 = performance.now();
    await seedDemo({ config, pool, db });
    await owner.query(fs.readFileSync(path.join(import.meta.dirname, "seed.sql"), "utf8"));
    console.log(`seeded in ${((performance.now() - t0) / 1000).toFixed(0)} s`);
  }
  await owner.end();
  return { config, pool, db, sessionPool };
}

/** The cookies of a signed-in demo account (session and CSRF), for GET requests. */
const cookieOf = async (base: string, email: string) => (await signIn(base, email, DEMO_PASSWORD)).cookie;

async function timings(base: string, cookie: string, url: string, n = 60) {
  const ms: number[] = [];
  let status = 0;
  let bytes = 0;
  for (let i = 0; i < n + 5; i++) {
    const t = performance.now();
    const r = await fetch(base + url, { headers: { cookie } });
    bytes = (await r.arrayBuffer()).byteLength;
    status = r.status;
    if (status !== 200) throw new Error(`${url}: ${status}`);
    if (i >= 5) ms.push(performance.now() - t); // the first five warm caches and plans
  }
  return { status, bytes, p50: quantile(ms, 0.5), p95: quantile(ms, 0.95) };
}

const deps = await prepare();
const server = createApp(deps).listen(servePort ?? 0, "127.0.0.1");
await new Promise((r) => server.once("listening", r));
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
if (servePort !== undefined) {
  console.log(`serving ${DB} on ${base} (demo accounts, password "${DEMO_PASSWORD}"); Ctrl-C stops`);
  process.on("SIGINT", () => process.exit(0));
} else {
  const admin = await cookieOf(base, "admin@ropewalk.test");
  const approver = await cookieOf(base, "approver@ropewalk.test");
  const midAudit = (await deps.pool.query("SELECT max(id) / 2 AS id FROM audit_events")).rows[0].id as string;
  const lists: [string, string, string][] = [
    ["/api/plans", "/api/plans", admin],
    ["/api/plans?state=in_review", "/api/plans?state=in_review", admin],
    ["/api/plans?q=…", "/api/plans?q=towline%20batch%20991", admin],
    ["/api/plans?sort=owner", "/api/plans?sort=owner&dir=asc", admin],
    ["/api/plans page 2 000", "/api/plans?page=2000", admin],
    ["/api/audit", "/api/audit", admin],
    ["/api/audit deep (keyset)", `/api/audit?before=${midAudit}`, admin],
    ["/api/audit deep (page 200)", "/api/audit?page=200", admin],
    ["/api/audit?actorId=…", "/api/audit?actorId=7", admin],
    ["/api/mail?q= (no match)", "/api/mail?q=no-such-words-here", admin],
    ["/api/plans/review-queue", "/api/plans/review-queue", approver],
    ["/api/plans/owners", "/api/plans/owners", admin],
    ["/api/models", "/api/models", admin],
    ["/api/models page 20", "/api/models?page=20", admin],
    ["/api/models?q=… (picker search)", "/api/models?q=Halyard-11&retired=exclude", admin],
    ["/api/users", "/api/users", admin],
    ["/api/users page 5", "/api/users?page=5", admin],
    ["/api/users?q=…", "/api/users?q=Ropemaker44", admin],
  ];
  console.log("endpoint                          status    p50 ms    p95 ms     bytes");
  for (const [label, url, cookie] of lists) {
    const t = await timings(base, cookie, url);
    console.log(
      `${label.padEnd(32)}  ${String(t.status).padEnd(6)} ${t.p50.toFixed(1).padStart(8)}  ${t.p95.toFixed(1).padStart(8)}  ${String(t.bytes).padStart(8)}`,
    );
  }
  const load = await autocannon({
    url: `${base}/api/plans`,
    connections: 50,
    duration: 15,
    headers: { cookie: admin },
  });
  console.log(
    `/api/plans at 50 connections: ${load.requests.average.toFixed(0)} req/s, p99 ${load.latency.p99} ms, ` +
      `${load.non2xx} non-2xx, ${load.errors} errors, ${load.timeouts} timeouts`,
  );
  server.close();
  server.closeAllConnections();
  await deps.pool.end();
  await deps.sessionPool.end();
}
