import { describe, expect, it } from "vitest";
import { ownerTestDb, testDb } from "../../setup/db";

// The app connects as a role that owns nothing (tests connect exactly as the server does); the owner role ran the
// migrations. Privilege failures are SQLSTATE 42501 insufficient_privilege (PostgreSQL docs, Appendix A).
const denied = { code: "42501" };

describe("database roles", () => {
  it("the app role owns no table, sequence, function or schema, and is no superuser", async () => {
    const { pool } = testDb();
    const me = (await pool.query("SELECT current_user AS u, rolsuper FROM pg_roles WHERE rolname = current_user"))
      .rows[0];
    expect(me.rolsuper).toBe(false);
    const owned = await pool.query(
      `SELECT c.relname AS name FROM pg_class c WHERE c.relowner = (SELECT oid FROM pg_roles WHERE rolname = current_user)
       UNION ALL SELECT proname FROM pg_proc WHERE proowner = (SELECT oid FROM pg_roles WHERE rolname = current_user)
       UNION ALL SELECT nspname FROM pg_namespace WHERE nspowner = (SELECT oid FROM pg_roles WHERE rolname = current_user)`,
    );
    expect(owned.rows).toEqual([]);
    const owner = (await ownerTestDb().pool.query("SELECT current_user AS u")).rows[0].u;
    expect(owner).not.toBe(me.u);
    expect(
      (await pool.query("SELECT tableowner FROM pg_tables WHERE tablename = 'audit_events'")).rows[0].tableowner,
    ).toBe(owner);
  });

  it("the app role may add and read audit rows but not UPDATE, DELETE or TRUNCATE them", async () => {
    const { pool } = testDb();
    const priv = (p: string) =>
      pool.query("SELECT has_table_privilege(current_user, 'audit_events', $1) AS ok", [p]).then((r) => r.rows[0].ok);
    expect([
      await priv("INSERT"),
      await priv("SELECT"),
      await priv("UPDATE"),
      await priv("DELETE"),
      await priv("TRUNCATE"),
    ]).toEqual([true, true, false, false, false]);
    await expect(
      pool.query("UPDATE audit_events SET action = 'x' WHERE id = (SELECT max(id) FROM audit_events)"),
    ).rejects.toMatchObject(denied);
    await expect(
      pool.query("DELETE FROM audit_events WHERE id = (SELECT max(id) FROM audit_events)"),
    ).rejects.toMatchObject(denied);
    await expect(pool.query("TRUNCATE audit_events")).rejects.toMatchObject(denied);
    await expect(pool.query("ALTER TABLE audit_events DISABLE TRIGGER audit_events_append_only")).rejects.toMatchObject(
      denied,
    );
    await expect(pool.query("CREATE TABLE app_made (v int)")).rejects.toMatchObject(denied);
  });

  it("the app role has plain DML on ordinary tables (sessions, outbox) but cannot TRUNCATE or drop them", async () => {
    const { pool } = testDb();
    for (const t of ["session", "mail_outbox", "users"]) {
      const r = await pool.query(
        `SELECT has_table_privilege(current_user, $1, 'SELECT,INSERT,UPDATE,DELETE') AS dml, has_table_privilege(current_user, $1, 'TRUNCATE') AS tr`,
        [t],
      );
      expect(r.rows[0], t).toEqual({ dml: true, tr: false });
    }
    await expect(pool.query("DROP TABLE session")).rejects.toMatchObject(denied);
  });

  it("a table a later migration creates is granted to the app role by default privileges", async () => {
    const owner = ownerTestDb().pool;
    const name = `later_${process.pid}_${Date.now()}`;
    await owner.query(`CREATE TABLE ${name} (id bigserial PRIMARY KEY, v int)`);
    try {
      await testDb().pool.query(`INSERT INTO ${name} (v) VALUES (1)`);
      expect((await testDb().pool.query(`SELECT v FROM ${name}`)).rows).toEqual([{ v: 1 }]);
    } finally {
      await owner.query(`DROP TABLE ${name}`);
    }
  });
});
