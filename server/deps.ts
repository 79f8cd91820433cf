import type pg from "pg";
import type { Store } from "express-rate-limit";
import type { Db } from "./db/client";
import type { Config } from "./config";
import type { Logger } from "./logger";

/** What createApp needs; tests build their own with a test database. */
export interface AppDeps {
  config: Config;
  pool: pg.Pool;
  db: Db;
  /** A small pool for the session store only (server/http/session.ts); unset = the main pool. */
  sessionPool?: pg.Pool;
  /** Shared store for the sign-in limiters (one per limiter name); unset = in-process memory. */
  /** Structured logger; createApp makes one from config.logLevel when unset. */
  logger?: Logger;
  limiterStore?: (name: string) => Store | undefined;
}
