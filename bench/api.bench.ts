import { execFileSync } from "node:child_process";
import type { AddressInfo } from "node:net";
import path from "node:path";
import { performance } from "node:perf_hooks";
import bcrypt from "bcryptjs";
import pg from "pg";
import { createApp } from "../server/app";
import { LOCAL_APP_ROLE, LOCAL_OWNER_ROLE, loadConfig } from "../server/config";
import { createDb } from "../server/db/client";
import { migrateDatabase } from "../server/db/migrate";
import { insertUser } from "../server/features/users/users.repo";
import { everyMethodQuestion } from "./analysis-question";
import { quantile, signIn } from "./http-client";

// The API under load on this machine: POST /api/analyses (all methods, d = 128, target 1 048 576) with 16 requests
// in flight, and how long /api/health takes while a smallest-base search runs in its worker thread.
// Uses a scratch database on the loopback cluster (ropewalk_bench), rebuilt from migrations each run.

const root = path.resolve(import.meta.dirname, "..");

export async function runApiBench() {
  const port = process.env.PGPORT ?? "54329";
  execFileSync("bash", [path.join(root, "docker-free-db-scripts/start.sh"), "postgres"], {
    stdio: ["ignore", "ignore", "inherit"],
  });
  const admin = new pg.Client({ connectionString: `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${port}/postgres` });
  await admin.connect();
  await admin.query("DROP DATABASE IF EXISTS ropewalk_bench WITH (FORCE)");
  await admin.query("CREATE DATABASE ropewalk_bench");
  await admin.end();
  const config = loadConfig({
    NODE_ENV: "test",
    DATABASE_URL: `postgres://${LOCAL_APP_ROLE}@127.0.0.1:${port}/ropewalk_bench`,
    LOGIN_LIMIT_PER_ADDRESS: "100000",
  });
  await migrateDatabase(`postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${port}/ropewalk_bench`, config.databaseUrl);
  const { pool, db } = createDb(config.databaseUrl, 10);
  await insertUser(db, {
    email: "bench@example.test",
    name: "Bench",
    roles: ["researcher"],
    passwordHash: await bcrypt.hash("bench-password-1", 12),
  });
  const server = createApp({ config, pool, db }).listen(0, "127.0.0.1");
  await new Promise((r) => server.once("listening", r));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

  const headers = await signIn(base, "bench@example.test", "bench-password-1");
  const body = JSON.stringify(everyMethodQuestion());

  const latencies: number[] = [];
  const total = 400;
  let next = 0;
  const t0 = performance.now();
  await Promise.all(
    Array.from({ length: 16 }, async () => {
      while (next++ < total) {
        const t = performance.now();
        const r = await fetch(`${base}/api/analyses`, { method: "POST", headers, body });
        await r.arrayBuffer();
        if (r.status !== 200) throw new Error(`analysis answered ${r.status}`);
        latencies.push(performance.now() - t);
      }
    }),
  );
  const secs = (performance.now() - t0) / 1000;
  console.log("\nAPI under load (16 in flight, real PostgreSQL session store)");
  console.log(
    `  POST /api/analyses, all methods, d = 128, target 1 048 576: ${(total / secs).toFixed(0)} req/s, p50 ${quantile(latencies, 0.5).toFixed(1)} ms, p95 ${quantile(latencies, 0.95).toFixed(1)} ms`,
  );

  const search = fetch(`${base}/api/bounds/base`, {
    method: "POST",
    headers,
    body: JSON.stringify({ rotaryDim: 128, targetContext: 1_048_576 }),
  });
  const health: number[] = [];
  let done = false;
  void search.then(() => (done = true));
  while (!done) {
    const t = performance.now();
    await (await fetch(`${base}/api/health`)).arrayBuffer();
    health.push(performance.now() - t);
  }
  console.log(
    `  GET /api/health during a smallest-base search (worker thread): ${health.length} answers, p50 ${quantile(health, 0.5).toFixed(1)} ms, max ${Math.max(...health).toFixed(1)} ms`,
  );
  server.close();
  server.closeAllConnections();
  await pool.end();
}
