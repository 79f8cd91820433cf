import pg from "pg";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import * as schema from "./schema";

export type Db = NodePgDatabase<typeof schema>;
/** A transaction executor; repos accept either (`Executor`). */
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
export type Executor = Db | Tx;

export function createDb(databaseUrl: string, max = 10) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max });
  const db = drizzle(pool, { schema });
  return { pool, db };
}
