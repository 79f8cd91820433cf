import { sql } from "drizzle-orm";
import type { Db } from "./client";

/**
 * Tables whose rows the app may add and read but never change or remove. The database enforces it twice:
 * the app role lacks UPDATE, DELETE and TRUNCATE here, and a trigger refuses UPDATE/DELETE even by the owner
 * (the owner can still disable that trigger, which is why audit rows are also hash-chained).
 */
export const APPEND_ONLY_TABLES = [
  "audit_events",
  "conformance_checks",
  "revision_evidence",
  "revision_proofs",
] as const;

const ident = (name: string) => sql.raw(`"${name.replace(/"/g, '""')}"`);

/** The user name in a postgres:// URL, decoded. */
export function roleOfUrl(url: string): string {
  return decodeURIComponent(new URL(url).username);
}

/**
 * Hands the app role what it needs and nothing more, as the owner, after migrations. Idempotent.
 * Tables and sequences that later migrations create are covered by ALTER DEFAULT PRIVILEGES at creation;
 * this step re-grants everything anyway and then takes the append-only rights back, so a new append-only
 * table only needs its name in APPEND_ONLY_TABLES.
 * Does nothing when both URLs name the same role (a one-role setup, e.g. an outside TEST_DATABASE_URL).
 */
export async function grantAppRole(owner: Db, appRole: string) {
  const me = (await owner.execute<{ u: string }>(sql`SELECT current_user AS u`)).rows[0].u;
  if (me === appRole) return false;
  const app = ident(appRole);
  await owner.transaction(async (tx) => {
    await tx.execute(sql`GRANT USAGE ON SCHEMA public TO ${app}`);
    await tx.execute(sql`GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${app}`);
    // nextval() needs USAGE on a sequence; serial/bigserial ids need it for every insert.
    await tx.execute(sql`GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO ${app}`);
    await tx.execute(
      sql`ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO ${app}`,
    );
    await tx.execute(sql`ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT USAGE, SELECT ON SEQUENCES TO ${app}`);
    await tx.execute(sql`REVOKE TRUNCATE, REFERENCES, TRIGGER ON ALL TABLES IN SCHEMA public FROM ${app}`);
    for (const t of APPEND_ONLY_TABLES) {
      // A database migrated only part of the way (an older release, or a test that stops before a table's
      // migration) lacks the later tables; their revoke runs after the migration that creates them.
      const exists = await tx.execute<{ r: string | null }>(sql`SELECT to_regclass(${`public.${t}`})::text AS r`);
      if (exists.rows[0]?.r === null) continue;
      await tx.execute(sql`REVOKE UPDATE, DELETE, TRUNCATE ON ${ident(t)} FROM ${app}, PUBLIC`);
    }
  });
  return true;
}
