import crypto from "node:crypto";
import pg from "pg";
import { createDb } from "../../server/db/client";
import { grantAppRole, roleOfUrl } from "../../server/db/grants";
import { runMigrations } from "../../server/db/migrate";
import { dropDatabase } from "./drop-database";

/**
 * A database of its own on the test cluster, for tests that tamper with what every other test shares (as the owner
 * role, which may create databases). `migrate(folder?)` builds it like global setup does; `drop()` removes it.
 */
export async function scratchDatabase() {
  const owner = process.env.TEST_MIGRATION_DATABASE_URL;
  const app = process.env.TEST_DATABASE_URL;
  if (!owner || !app)
    throw new Error("run through vitest (globalSetup sets TEST_DATABASE_URL and TEST_MIGRATION_DATABASE_URL)");
  const name = `rw_scratch_${crypto.randomBytes(4).toString("hex")}`;
  const withDb = (url: string, db: string) => Object.assign(new URL(url), { pathname: `/${db}` }).toString();
  const maintenance = withDb(owner, "postgres");
  const c = new pg.Client({ connectionString: maintenance });
  await c.connect();
  await c.query(`CREATE DATABASE ${name}`);
  await c.end();
  const ownerDb = createDb(withDb(owner, name), 2);
  const appDb = createDb(withDb(app, name), 4);
  return {
    owner: ownerDb,
    app: appDb,
    async migrate(folder?: string) {
      await runMigrations(ownerDb.db, folder);
      await grantAppRole(ownerDb.db, roleOfUrl(app));
    },
    async drop() {
      await Promise.all([ownerDb.pool.end(), appDb.pool.end()]);
      await dropDatabase(maintenance, name);
    },
  };
}
