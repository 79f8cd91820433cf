import pg from "pg";

/**
 * DROP DATABASE as the owner role. Not WITH (FORCE): that must be allowed to end every session in the database,
 * and an autovacuum worker runs as the superuser, which the owner role may not signal. A plain DROP stops
 * autovacuum itself and waits for nothing else once our pools are closed; a session still closing gets a retry.
 */
export async function dropDatabase(maintenanceUrl: string, name: string) {
  const c = new pg.Client({ connectionString: maintenanceUrl });
  await c.connect();
  try {
    for (let attempt = 0; ; attempt++) {
      try {
        await c.query(`DROP DATABASE IF EXISTS ${name}`);
        return;
      } catch (e) {
        // 55006 object_in_use: "database is being accessed by other users"
        if ((e as { code?: string }).code !== "55006" || attempt >= 20) throw e;
        await new Promise((r) => setTimeout(r, 250));
      }
    }
  } finally {
    await c.end();
  }
}
