import pg from "pg";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import * as schema from "./schema";

export type Db = NodePgDatabase<typeof schema>;
/** A transaction executor; repos accept either (`Executor`). */
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
export type Executor = Db | Tx;

export interface DbTimeouts {
  /** How long to wait for a new connection before giving up (a stopped or unreachable server). */
  connectMs: number;
  /** Server-side cap per statement; the client-side read timeout is a little longer, for a server that hangs. 0: none. */
  statementMs: number;
}
/** A few seconds each: a database that is down or hung gives 503s quickly instead of 20-second hangs. */
export const DEFAULT_DB_TIMEOUTS: DbTimeouts = { connectMs: 3000, statementMs: 5000 };
/** For migrations: a schema change on a large table may rightly take longer than any request should. */
export const MIGRATION_DB_TIMEOUTS: DbTimeouts = { connectMs: DEFAULT_DB_TIMEOUTS.connectMs, statementMs: 0 };

/**
 * Every pool gets an `error` listener: without one, an idle client losing its connection (PostgreSQL stopped
 * or restarted) is an unhandled 'error' event that ends the process. Only the message and code are logged;
 * the client object itself (which carries connection secrets) never is.
 */
export function createDb(databaseUrl: string, max = 10, timeouts: DbTimeouts = DEFAULT_DB_TIMEOUTS) {
  const pool = new pg.Pool({
    connectionString: databaseUrl,
    max,
    connectionTimeoutMillis: timeouts.connectMs,
    ...(timeouts.statementMs > 0
      ? { statement_timeout: timeouts.statementMs, query_timeout: timeouts.statementMs + 1000 }
      : {}),
  });
  watchPool(pool);
  const db = drizzle(pool, { schema });
  return { pool, db };
}

let lastLogged = "";
/** Logs pool errors once per distinct message so an outage does not flood the log. */
export function watchPool(pool: pg.Pool) {
  pool.on("error", (err: Error & { code?: string }) => {
    const line = `${err.code ?? "error"}: ${err.message}`;
    if (line === lastLogged) return;
    lastLogged = line;
    console.error(`[db] an idle connection failed (${line}); new requests reconnect when the database is back`);
  });
}
