import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { createDb } from "../../server/db/client";
import { grantAppRole, roleOfUrl } from "../../server/db/grants";
import { MIGRATIONS_DIR, runMigrations } from "../../server/db/migrate";
import { dropDatabase } from "./drop-database";

/**
 * A database of its own on the test cluster, for tests that tamper with what every other test shares (as the owner
 * role, which may create databases). `migrate(folder?)` builds it like global setup does; `migrateBefore(tagEnd)`
 * builds it up to the migration before the one whose tag ends with `tagEnd` (for a test of that migration's backfill);
 * `drop()` removes it.
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
    async migrateBefore(tagEnd: string) {
      // A copy of migrations/ whose journal is cut just before that migration.
      const journal = JSON.parse(fs.readFileSync(path.join(MIGRATIONS_DIR, "meta/_journal.json"), "utf8"));
      const cut = journal.entries.findIndex((e: { tag: string }) => e.tag.endsWith(tagEnd));
      if (cut < 1) throw new Error(`no migration after the first has a tag ending in ${tagEnd}`);
      const dir = fs.mkdtempSync(path.join(os.tmpdir(), "rw-migrations-"));
      try {
        fs.cpSync(MIGRATIONS_DIR, dir, { recursive: true });
        fs.writeFileSync(
          path.join(dir, "meta/_journal.json"),
          JSON.stringify({ ...journal, entries: journal.entries.slice(0, cut) }),
        );
        await this.migrate(dir);
      } finally {
        fs.rmSync(dir, { recursive: true, force: true });
      }
    },
    async drop() {
      await Promise.all([ownerDb.pool.end(), appDb.pool.end()]);
      await dropDatabase(maintenance, name);
    },
  };
}
