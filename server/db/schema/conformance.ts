import { sql } from "drizzle-orm";
import {
  boolean,
  check,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  serial,
  text,
  timestamp,
} from "drizzle-orm/pg-core";
import type { ProbeGroupCheck } from "../../../shared/schemas/conformance";
import { users } from "./users";
import { planRevisions, plans } from "./plans";

/**
 * Probe results recorded on a revision (issue 10). A row is evidence: it is never edited (append-only for the app role,
 * server/db/grants.ts). `upload` keeps the probe's JSON as received (after validation) so the comparison can be redone.
 */
export const conformanceChecks = pgTable(
  "conformance_checks",
  {
    id: serial("id").primaryKey(),
    planId: integer("plan_id")
      .notNull()
      .references(() => plans.id, { onDelete: "cascade" }),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => planRevisions.id, { onDelete: "cascade" }),
    contentHash: text("content_hash").notNull(),
    byUserId: integer("by_user_id")
      .notNull()
      .references(() => users.id),
    via: text("via").$type<"session" | "token">().notNull(),
    passed: boolean("passed").notNull(),
    maxRelativeError: doublePrecision("max_relative_error"),
    worstPair: integer("worst_pair"),
    cause: text("cause").notNull().default(""),
    library: text("library").notNull(),
    libraryVersion: text("library_version").notNull(),
    ropeType: text("rope_type").notNull(),
    runningLength: integer("running_length").notNull(),
    planFingerprint: text("plan_fingerprint"),
    readFingerprint: text("read_fingerprint").notNull(),
    fingerprintMatches: boolean("fingerprint_matches"),
    /** a layered comparison's result per layer group (kind, layers, passed, error, pair, cause); null when read once */
    groups: jsonb("groups").$type<ProbeGroupCheck[]>(),
    upload: jsonb("upload").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("conformance_checks_plan").on(t.planId, t.createdAt),
    check("conformance_checks_via_known", sql`${t.via} IN ('session', 'token')`),
  ],
);
