import type pg from "pg";
import type { Db } from "./db/client";
import type { Config } from "./config";

/** What createApp needs; tests build their own with a test database. */
export interface AppDeps {
  config: Config;
  pool: pg.Pool;
  db: Db;
}
