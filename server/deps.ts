import type pg from "pg";
import type { Store } from "express-rate-limit";
import type { Db } from "./db/client";
import type { Config } from "./config";

/** What createApp needs; tests build their own with a test database. */
export interface AppDeps {
  config: Config;
  pool: pg.Pool;
  db: Db;
  /** Shared store for the sign-in limiters (one per limiter name); unset = in-process memory. */
  limiterStore?: (name: string) => Store | undefined;
}
