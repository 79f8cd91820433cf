import { sql } from "drizzle-orm";
import {
  boolean,
  index,
  integer,
  jsonb,
  pgTable,
  serial,
  text,
  timestamp,
  varchar,
  bigserial,
} from "drizzle-orm/pg-core";

export const users = pgTable(
  "users",
  {
    id: serial("id").primaryKey(),
    email: text("email").notNull().unique(),
    name: text("name").notNull(),
    passwordHash: text("password_hash").notNull(),
    roles: text("roles").array().notNull(),
    active: boolean("active").notNull().default(true),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("users_name_idx").on(sql`lower(${t.name})`, t.id),
    index("users_name_trgm").using("gin", t.name.op("gin_trgm_ops")),
  ],
);

/** connect-pg-simple's table, created by migration (createTableIfMissing is off). */
export const session = pgTable(
  "session",
  {
    sid: varchar("sid").primaryKey(),
    sess: jsonb("sess").notNull(),
    expire: timestamp("expire", { precision: 6 }).notNull(),
  },
  (t) => [index("IDX_session_expire").on(t.expire)],
);

/** Append-only: the app never updates or deletes rows (a trigger in the migration enforces it). */
export const auditEvents = pgTable(
  "audit_events",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
    actorId: integer("actor_id").references(() => users.id),
    action: text("action").notNull(),
    subjectType: text("subject_type").notNull(),
    subjectId: text("subject_id"),
    detail: jsonb("detail").notNull().default({}),
    /** Hash chain (server/platform/audit-chain.ts): the predecessor's hash, and this row's own. */
    prevHash: text("prev_hash").notNull(),
    hash: text("hash").notNull(),
  },
  (t) => [
    index("audit_events_at_idx").on(t.at),
    index("audit_events_subject_idx").on(t.subjectType, t.subjectId),
    // One person's actions, newest first, without walking everyone's.
    index("audit_events_actor_idx").on(t.actorId, t.id),
    // The action filter is a prefix (LIKE 'decision.%'); text_pattern_ops serves it whatever the collation, so a rare
    // action is an index range instead of a walk of the whole trail, and its capped count an index-only scan.
    index("audit_events_action_idx").on(t.action.op("text_pattern_ops"), t.id),
  ],
);

/**
 * Sign-in rate-limit counters shared by every app instance (server/platform/rate-limit-store.ts): one row per limiter
 * key with its hits in the current window. Rows past their window are reset on the next hit and pruned now and then.
 */
export const rateLimitHits = pgTable(
  "rate_limit_hits",
  {
    key: text("key").primaryKey(),
    hits: integer("hits").notNull(),
    resetAt: timestamp("reset_at", { withTimezone: true }).notNull(),
  },
  (t) => [index("rate_limit_hits_reset_idx").on(t.resetAt)],
);
