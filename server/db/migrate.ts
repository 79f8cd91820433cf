import path from "node:path";
import { fileURLToPath } from "node:url";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { createDb, MIGRATION_DB_TIMEOUTS, type Db } from "./client";

export const MIGRATIONS_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../migrations");

/** Every database (start, tests, production) is built by running migrations/ and nothing else. */
export async function runMigrations(db: Db) {
  await migrate(db, { migrationsFolder: MIGRATIONS_DIR });
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const { loadConfig } = await import("../config");
  const { pool, db } = createDb(loadConfig().databaseUrl, 1, MIGRATION_DB_TIMEOUTS);
  await runMigrations(db);
  await pool.end();
  console.log("migrations applied");
}
