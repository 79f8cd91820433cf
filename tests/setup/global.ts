import { execFileSync } from "node:child_process";
import path from "node:path";
import pg from "pg";
import { createDb } from "../../server/db/client";
import { runMigrations } from "../../server/db/migrate";

const root = path.resolve(import.meta.dirname, "../..");

/** One loopback cluster (started or reused), a fresh test database built by migrations only. */
export default async function setup() {
  const port = process.env.PGPORT ?? "54329";
  let url = process.env.TEST_DATABASE_URL;
  if (!url) {
    execFileSync("bash", [path.join(root, "docker-free-db-scripts/start.sh"), "postgres"], {
      stdio: ["ignore", "ignore", "inherit"],
      env: { ...process.env, PGPORT: port },
    });
    const admin = new pg.Client({ connectionString: `postgres://app@127.0.0.1:${port}/postgres` });
    await admin.connect();
    await admin.query("DROP DATABASE IF EXISTS ropewalk_test WITH (FORCE)");
    await admin.query("CREATE DATABASE ropewalk_test");
    await admin.end();
    url = `postgres://app@127.0.0.1:${port}/ropewalk_test`;
  }
  const { pool, db } = createDb(url, 1);
  await runMigrations(db);
  await pool.end();
  process.env.TEST_DATABASE_URL = url;
}
