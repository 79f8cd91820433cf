import path from "node:path";
import { fileURLToPath } from "node:url";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import type { Config } from "../config";
import { createDb, MIGRATION_DB_TIMEOUTS, type Db } from "./client";
import { grantAppRole, roleOfUrl } from "./grants";
import { backfillFingerprints } from "./backfill-fingerprints";
import { projectRoot } from "../platform/project-root";

export const MIGRATIONS_DIR = path.join(projectRoot(), "migrations");

/** Every database (start, tests, production) is built by running migrations/ and nothing else. */
export async function runMigrations(db: Db, migrationsFolder = MIGRATIONS_DIR) {
  await migrate(db, { migrationsFolder });
}

/** Migrations as the owner role, then the app role's privileges (server/db/grants.ts). */
export async function migrateDatabase(ownerUrl: string, appUrl: string) {
  const { pool, db } = createDb(ownerUrl, 1, MIGRATION_DB_TIMEOUTS);
  try {
    await runMigrations(db);
    await backfillFingerprints(db);
    await grantAppRole(db, roleOfUrl(appUrl));
  } finally {
    await pool.end();
  }
}

/** The owner URL, or a plain error naming the variable (production without MIGRATION_DATABASE_URL). */
export function migrationUrl(config: Config): string {
  if (!config.migrationDatabaseUrl) {
    throw new Error(
      "MIGRATION_DATABASE_URL is required to run migrations (the role that owns the tables; DATABASE_URL is the app's role)",
    );
  }
  return config.migrationDatabaseUrl;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const { loadConfig } = await import("../config");
  const config = loadConfig();
  await migrateDatabase(migrationUrl(config), config.databaseUrl);
  console.log("migrations applied");
}
