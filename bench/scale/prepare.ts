// The bench:scale database: ropewalk_bench_scale on the loopback cluster, migrated, and seeded to a busy lab's year once
// (kept between runs: seeding takes minutes; `--reseed` drops and rebuilds it).
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { performance } from "node:perf_hooks";
import pg from "pg";
import { LOCAL_APP_ROLE, LOCAL_OWNER_ROLE, loadConfig } from "../../server/config";
import { createDb } from "../../server/db/client";
import { migrateDatabase } from "../../server/db/migrate";
import { seedDemo } from "../../server/db/seed";

const root = path.resolve(import.meta.dirname, "../..");
export const BENCH_DB = "ropewalk_bench_scale";
const port = process.env.PGPORT ?? "54329";
export const ownerUrl = `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${port}/${BENCH_DB}`;
export const appUrl = `postgres://${LOCAL_APP_ROLE}@127.0.0.1:${port}/${BENCH_DB}`;

export async function prepare(reseed: boolean) {
  execFileSync("bash", [path.join(root, "docker-free-db-scripts/start.sh"), "postgres"], {
    stdio: ["ignore", "ignore", "inherit"],
  });
  const admin = new pg.Client({ connectionString: `postgres://${LOCAL_OWNER_ROLE}@127.0.0.1:${port}/postgres` });
  await admin.connect();
  if (reseed) await admin.query(`DROP DATABASE IF EXISTS ${BENCH_DB} WITH (FORCE)`);
  const exists = (await admin.query("SELECT 1 FROM pg_database WHERE datname = $1", [BENCH_DB])).rowCount;
  if (!exists) await admin.query(`CREATE DATABASE ${BENCH_DB}`);
  await admin.end();
  const config = loadConfig({
    NODE_ENV: "development",
    LOG_LEVEL: "warn",
    DATABASE_URL: appUrl,
    LOGIN_LIMIT_PER_ADDRESS: "100000",
  });
  await migrateDatabase(ownerUrl, config.databaseUrl);
  const { pool, db } = createDb(config.databaseUrl, 10);
  const { pool: sessionPool } = createDb(config.databaseUrl, 3);
  const owner = new pg.Client({ connectionString: ownerUrl });
  await owner.connect();
  const plans = Number((await owner.query("SELECT count(*) AS n FROM plans")).rows[0].n);
  if (plans < 100_000) {
    console.log(`seeding ${BENCH_DB} (demo scenario, then the year's volumes through SQL)…`);
    const t0 = performance.now();
    await seedDemo({ config, pool, db });
    await owner.query(fs.readFileSync(path.join(import.meta.dirname, "seed.sql"), "utf8"));
    console.log(`seeded in ${((performance.now() - t0) / 1000).toFixed(0)} s`);
  }
  await owner.end();
  return { config, pool, db, sessionPool };
}
