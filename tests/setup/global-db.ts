import { execFileSync } from "node:child_process";
import path from "node:path";
import pg from "pg";
import { LOCAL_APP_ROLE, LOCAL_OWNER_ROLE } from "../../server/config";
import { migrateDatabase } from "../../server/db/migrate";
import { dropDatabase } from "./drop-database";

const root = path.resolve(import.meta.dirname, "../..");

// The api and e2e projects both list this file; Vitest runs each project's global setup in the one main
// process, so the first call makes the database and later calls reuse it (one database per run).
const ONCE = Symbol.for("ropewalk.test-database");
type Once = { [ONCE]?: Promise<(() => Promise<void>) | undefined> };

/**
 * One loopback cluster (started or reused) and a fresh database for this run, built by migrations only, as the
 * owner role; tests connect as the app role (TEST_DATABASE_URL) like the server does, and reach the owner through
 * TEST_MIGRATION_DATABASE_URL. Each run gets its own database (dropped at the end), so two runs never collide.
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
    process.env.TEST_MIGRATION_DATABASE_URL ??= process.env.TEST_DATABASE_URL;
    await migrateDatabase(process.env.TEST_MIGRATION_DATABASE_URL, process.env.TEST_DATABASE_URL);
    return undefined;
  }
  const port = process.env.PGPORT ?? "54329";
  execFileSync("bash", [path.join(root, "docker-free-db-scripts/start.sh"), "postgres"], {
    stdio: ["ignore", "ignore", "inherit"],
    env: { ...process.env, PGPORT: port },
  });
  const name = `ropewalk_test_${process.pid}`;
  // The owner role may create and drop databases.
  const maintenanceUrl = `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${port}/postgres`;
  await dropDatabase(maintenanceUrl, name);
  const admin = new pg.Client({ connectionString: maintenanceUrl });
  await admin.connect();
  await admin.query(`CREATE DATABASE ${name}`);
  await admin.end();
  const ownerUrl = `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${port}/${name}`;
  const appUrl = `postgres://${LOCAL_APP_ROLE}@127.0.0.1:${port}/${name}`;
  await migrateDatabase(ownerUrl, appUrl);
  process.env.TEST_DATABASE_URL = appUrl;
  process.env.TEST_MIGRATION_DATABASE_URL = ownerUrl;

  return () => dropDatabase(maintenanceUrl, name);
}
