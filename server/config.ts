import { z } from "zod";
import path from "node:path";
import { DEFAULT_DB_TIMEOUTS, type DbTimeouts } from "./db/client";

const bool = z.enum(["true", "false", "1", "0"]).transform((v) => v === "true" || v === "1");

const envSchema = z.object({
  NODE_ENV: z.enum(["development", "test", "production"]).default("development"),
  HOST: z.string().default("127.0.0.1"),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  PGPORT: z.coerce.number().int().min(1).max(65535).default(54329),
  DATABASE_URL: z.string().optional(),
  MIGRATION_DATABASE_URL: z.string().optional(),
  SESSION_SECRET: z.string().min(16).optional(),
  SMTP_URL: z.string().optional(),
  MAIL_FROM: z.string().default("Ropewalk <ropewalk@ropewalk.test>"),
  MAIL_SINK_PORT: z.coerce.number().int().min(0).max(65535).default(2525),
  MAIL_RETRY_BASE_MS: z.coerce.number().int().min(0).default(5000),
  PUBLIC_URL: z.string().optional(),
  CLIENT_DIR: z.string().optional(),
  SIGNING_KEY_FILE: z.string().min(1).optional(),
  TRUST_PROXY: bool.optional(),
  LOG_LEVEL: z.enum(["fatal", "error", "warn", "info", "debug", "trace", "silent"]).optional(),
  RATE_LIMIT_STORE: z.enum(["postgres", "memory"]).optional(),
  LOGIN_LIMIT_PER_ACCOUNT_ADDRESS: z.coerce.number().int().positive().default(10),
  LOGIN_LIMIT_PER_ADDRESS: z.coerce.number().int().positive().default(100),
  LOGIN_WINDOW_MINUTES: z.coerce.number().positive().default(15),
  LOGIN_LIMIT_PER_ACCOUNT: z.coerce.number().int().positive().default(50),
  LOGIN_ACCOUNT_WINDOW_MINUTES: z.coerce.number().positive().default(60),
  DB_CONNECT_TIMEOUT_MS: z.coerce.number().int().min(100).max(600_000).default(DEFAULT_DB_TIMEOUTS.connectMs),
  DB_STATEMENT_TIMEOUT_MS: z.coerce.number().int().min(100).max(3_600_000).default(DEFAULT_DB_TIMEOUTS.statementMs),
});

/** The roles docker-free-db-scripts/start.sh creates on the loopback cluster. */
export const LOCAL_APP_ROLE = "ropewalk_app";
export const LOCAL_OWNER_ROLE = "ropewalk_owner";
const localDatabaseUrl = (role: string, port: number) => `postgres://${role}@127.0.0.1:${port}/ropewalk`;

export interface Config {
  env: "development" | "test" | "production";
  host: string;
  port: number;
  /** The app role: owns nothing, gets only the privileges server/db/grants.ts hands it. */
  databaseUrl: string;
  /**
   * The owner role that runs migrations. Null in production when MIGRATION_DATABASE_URL is missing (the server
   * itself does not need it; the migration commands refuse to run). Outside production it falls back to
   * DATABASE_URL, i.e. one role for both, when only that is given.
   */
  migrationDatabaseUrl: string | null;
  sessionSecret: string;
  cookieSecure: boolean;
  trustProxy: boolean;
  /** Where mail goes; defaults to the local sink outside production. */
  smtpUrl?: string;
  mailFrom: string;
  mailSinkPort: number;
  mailRetryBaseMs: number;
  publicUrl: string;
  clientDir: string;
  /**
   * Failed sign-ins allowed per window: per account+address (tight), per address, and per account across all
   * addresses (a higher ceiling over a longer window, so strangers cannot lock the owner out quickly).
   */
  login: {
    perAccountAddress: number;
    perAddress: number;
    windowMs: number;
    perAccount: number;
    accountWindowMs: number;
  };
  /** Ed25519 private key (PKCS#8 PEM, mode 0600) that signs decisions; created at first start when missing. */
  signingKeyFile: string;
  bcryptCost: number;
  /** pino level (LOG_LEVEL); tests are silent unless LOG_LEVEL says otherwise. */
  logLevel: string;
  /** Where sign-in limit counters live (RATE_LIMIT_STORE): PostgreSQL, shared by instances; memory under tests. */
  rateLimitStore: "postgres" | "memory";
  /** PostgreSQL connection and statement timeouts (DB_CONNECT_TIMEOUT_MS, DB_STATEMENT_TIMEOUT_MS). */
  db: DbTimeouts;
}

/** Parses the environment once; a bad value stops the process with the variable named. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env, overrides: Partial<Config> = {}): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const names = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
    throw new Error(`bad environment: ${names}`);
  }
  const e = parsed.data;
  const production = e.NODE_ENV === "production";
  if (production && !e.SESSION_SECRET) throw new Error("bad environment: SESSION_SECRET is required in production");
  if (production && !e.DATABASE_URL) throw new Error("bad environment: DATABASE_URL is required in production");
  return {
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    databaseUrl: e.DATABASE_URL ?? localDatabaseUrl(LOCAL_APP_ROLE, e.PGPORT),
    migrationDatabaseUrl:
      e.MIGRATION_DATABASE_URL ??
      (e.DATABASE_URL ? (production ? null : e.DATABASE_URL) : localDatabaseUrl(LOCAL_OWNER_ROLE, e.PGPORT)),
    sessionSecret: e.SESSION_SECRET ?? "ropewalk-local-development-secret",
    cookieSecure: production,
    trustProxy: e.TRUST_PROXY ?? false,
    logLevel: e.LOG_LEVEL ?? (e.NODE_ENV === "test" ? "silent" : "info"),
    rateLimitStore: e.RATE_LIMIT_STORE ?? (e.NODE_ENV === "test" ? "memory" : "postgres"),
    smtpUrl: e.SMTP_URL ?? (production ? undefined : `smtp://127.0.0.1:${e.MAIL_SINK_PORT}`),
    mailFrom: e.MAIL_FROM,
    mailSinkPort: e.MAIL_SINK_PORT,
    mailRetryBaseMs: e.MAIL_RETRY_BASE_MS,
    publicUrl: e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`,
    clientDir: path.resolve(e.CLIENT_DIR ?? "dist/client"),
    // Outside the database on purpose: whoever can rewrite rows must not also be able to re-sign them.
    signingKeyFile: path.resolve(e.SIGNING_KEY_FILE ?? ".data/signing-key.pem"),
    login: {
      perAccountAddress: e.LOGIN_LIMIT_PER_ACCOUNT_ADDRESS,
      perAddress: e.LOGIN_LIMIT_PER_ADDRESS,
      windowMs: e.LOGIN_WINDOW_MINUTES * 60_000,
      perAccount: e.LOGIN_LIMIT_PER_ACCOUNT,
      accountWindowMs: e.LOGIN_ACCOUNT_WINDOW_MINUTES * 60_000,
    },
    // 12 is common practice for interactive sign-in (no source); 4 is the least bcrypt accepts (Provos & Mazières 1999,
    // cost = log2 of the key-expansion rounds). Tests sign in about a hundred times, so they use the least.
    bcryptCost: e.NODE_ENV === "test" ? 4 : 12,
    db: { connectMs: e.DB_CONNECT_TIMEOUT_MS, statementMs: e.DB_STATEMENT_TIMEOUT_MS },
    ...overrides,
  };
}
