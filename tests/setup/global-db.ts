import { execFileSync } from "node:child_process";
import path from "node:path";
import pg from "pg";
import { createDb } from "../../server/db/client";
import { runMigrations } from "../../server/db/migrate";

const root = path.resolve(import.meta.dirname, "../..");

// The api and e2e projects both list this file; Vitest runs each project's global setup in the one main
// process, so the first call makes the database and later calls reuse it (one database per run).
const ONCE = Symbol.for("ropewalk.test-database");
type Once = { [ONCE]?: Promise<(() => Promise<void>) | undefined> };

/**
 * One loopback cluster (started or reused) and a fresh database for this run, built by migrations only.
 * Each run gets its own database (dropped at the end), so two runs on one machine never disturb each other.
 * Only the projects that need PostgreSQL list this file; `npm run test:unit` never reaches it.
 */
export default async function setup() {
  const g = globalThis as Once;
  if (g[ONCE]) {
    await g[ONCE];
    return; // the first caller's teardown drops the database
  }
  g[ONCE] = makeDatabase();
  return g[ONCE];
}

async function makeDatabase() {
  if (process.env.TEST_DATABASE_URL) {
    const { pool, db } = createDb(process.env.TEST_DATABASE_URL, 1);
    await runMigrations(db);
    await pool.end();
    return undefined;
  }
  const port = process.env.PGPORT ?? "54329";
  execFileSync("bash", [path.join(root, "docker-free-db-scripts/start.sh"), "postgres"], {
    stdio: ["ignore", "ignore", "inherit"],
    env: { ...process.env, PGPORT: port },
  });
  const name = `ropewalk_test_${process.pid}`;
  const adminUrl = `postgres://app@127.0.0.1:${port}/postgres`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
  await admin.query(`CREATE DATABASE ${name}`);
  await admin.end();
  const url = `postgres://app@127.0.0.1:${port}/${name}`;
  const { pool, db } = createDb(url, 1);
  await runMigrations(db);
  await pool.end();
  process.env.TEST_DATABASE_URL = url;

  return async () => {
    const c = new pg.Client({ connectionString: adminUrl });
    await c.connect();
    await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    await c.end();
  };
}
