import { execFileSync, spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import pg from "pg";
import { createDb } from "../../server/db/client";
import { runMigrations } from "../../server/db/migrate";

const root = path.resolve(import.meta.dirname, "../..");

/**
 * The browser tests drive Debian's Chromium; on a fresh machine `npm test` installs it the way `npm start`
 * installs PostgreSQL (root with apt-get), or says plainly what is missing.
 */
function ensureChromium() {
  if (process.env.CHROMIUM_PATH || fs.existsSync("/usr/lib/chromium/chromium") || fs.existsSync("/usr/bin/chromium")) return;
  const asRoot = process.getuid?.() === 0;
  const hasApt = spawnSync("sh", ["-c", "command -v apt-get"]).status === 0;
  if (!asRoot || !hasApt) {
    console.error("Chromium is missing for the browser tests: install it with `apt-get install -y chromium` (or set CHROMIUM_PATH).");
    return;
  }
  console.error("Chromium is missing; installing Debian's package for the browser tests: apt-get install -y chromium");
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  const tryInstall = () => spawnSync("apt-get", ["install", "-y", "chromium"], { stdio: ["ignore", "ignore", "inherit"], env }).status === 0;
  if (!tryInstall()) {
    spawnSync("apt-get", ["update"], { stdio: ["ignore", "ignore", "inherit"], env });
    if (!tryInstall()) console.error("apt-get install -y chromium failed; the browser tests will fail until Chromium is installed.");
  }
}

/**
 * One loopback cluster (started or reused) and a fresh database for this run, built by migrations only.
 * Each run gets its own database (dropped at the end), so two runs on one machine never disturb each other.
 */
export default async function setup() {
  ensureChromium();
  if (process.env.TEST_DATABASE_URL) {
    const { pool, db } = createDb(process.env.TEST_DATABASE_URL, 1);
    await runMigrations(db);
    await pool.end();
    return;
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
