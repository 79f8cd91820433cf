// A transaction whose BEGIN or ROLLBACK fails must give its connection back to the pool (destroyed, since its state is
// unknown). drizzle-orm 0.45.x runs BEGIN outside the try/finally that releases the client, and releases a client whose
// ROLLBACK failed as healthy (drizzle-team/drizzle-orm#6114, #6241; fix proposed in PR #6120). Ropewalk carries that fix
// as patches/drizzle-orm+*.patch until a release has it. Before it, one failed BEGIN during a database outage held a
// pool slot for good, and pool.end() at shutdown waited for it for ever (tests/api/db-outage.test.ts).
// Real PostgreSQL: the read timeout fires because the connection is busy with our own pg_sleep, not because of a stub.
import { sql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import { afterEach, describe, expect, it } from "vitest";
import { watchPool } from "../../server/db/client";

/**
 * One connection, a client-side read timeout (pg's query_timeout) of 300 ms and no server-side statement timeout, so a
 * pg_sleep keeps the connection busy past the read timeout, as a hung server does. The server's pools set both.
 */
function onePool() {
  const pool = new pg.Pool({
    connectionString: process.env.TEST_DATABASE_URL,
    max: 1,
    connectionTimeoutMillis: 3000,
    query_timeout: 300,
  });
  watchPool(pool);
  return { pool, db: drizzle(pool) };
}
const ended: Array<() => Promise<void>> = [];
afterEach(async () => {
  for (const end of ended.splice(0)) await end();
});

/** Resolves true when pool.end() finished within `ms`: it waits for every checked-out client to come back. */
const endsWithin = (pool: { end(): Promise<void> }, ms: number) =>
  Promise.race([pool.end().then(() => true), new Promise<boolean>((r) => setTimeout(() => r(false), ms))]);

describe("a failed transaction start or rollback releases its pool connection", () => {
  it("BEGIN that times out (the connection is still busy) releases the client", async () => {
    const { pool, db } = onePool();
    // The first checkout's connection gets a 3 s sleep queued ahead of drizzle's BEGIN, so BEGIN hits the read timeout.
    pool.once("acquire", (client) => void client.query("select pg_sleep(3)").catch(() => undefined));
    await expect(db.transaction(async (tx) => tx.execute(sql`select 1`))).rejects.toThrow(/begin/);
    // The one slot is free again: the next query gets a (new) connection and answers.
    const r = await db.execute(sql`select 2 as two`);
    expect(r.rows).toEqual([{ two: 2 }]);
    expect(await endsWithin(pool, 5000)).toBe(true);
  });

  it("a statement and its ROLLBACK that time out destroy the client instead of handing it out again", async () => {
    const { pool, db } = onePool();
    ended.push(() => pool.end());
    await expect(db.transaction(async (tx) => tx.execute(sql`select pg_sleep(3)`))).rejects.toThrow();
    // A client returned as healthy would still be busy with the sleep, and this query would time out behind it.
    const r = await db.execute(sql`select 3 as three`);
    expect(r.rows).toEqual([{ three: 3 }]);
  });
});
