import type pg from "pg";
import { createDb } from "../../server/db/client";

let shared: ReturnType<typeof createDb> | undefined;

/** One pool per test worker on the migrated test database. */
export function testDb() {
  const url = process.env.TEST_DATABASE_URL;
  if (!url) throw new Error("TEST_DATABASE_URL is not set; run tests through vitest (globalSetup)");
  shared ??= createDb(url, 5);
  return shared;
}

let owner: ReturnType<typeof createDb> | undefined;

/** The owner role's pool on the test database: for tests that play a database administrator (never the app). */
export function ownerTestDb() {
  const url = process.env.TEST_MIGRATION_DATABASE_URL;
  if (!url) throw new Error("TEST_MIGRATION_DATABASE_URL is not set; run tests through vitest (globalSetup)");
  owner ??= createDb(url, 2);
  return owner;
}

/** Runs one statement that should be refused; answers PostgreSQL's error (code, constraint), or undefined if it ran. */
export async function sqlError(pool: pg.Pool, text: string, values: unknown[]) {
  try {
    await pool.query(text, values);
    return undefined;
  } catch (e) {
    return e as { code?: string; constraint?: string };
  }
}
