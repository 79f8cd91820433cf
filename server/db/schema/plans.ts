import { sql } from "drizzle-orm";
import { check, index, integer, jsonb, pgTable, serial, text, timestamp, uniqueIndex } from "drizzle-orm/pg-core";
import { DECISIONS, REVISION_STATES, type RevisionState } from "../../../shared/schemas/plans";
import { PROOF_STATES, type ProofState } from "../../../shared/schemas/evidence-api";
import { users } from "./users";
import { modelProfiles } from "./models";
import { inList } from "./sql-lists";

/** Lab-wide settings (one row per key). */
export const settings = pgTable(
  "settings",
  {
    key: text("key").primaryKey(),
    value: jsonb("value").notNull(),
    updatedBy: integer("updated_by").references(() => users.id),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    // The workspace currency is an ISO 4217 code: three capital letters, as a JSON string.
    check(
      "settings_currency_code",
      sql`${t.key} <> 'currency' OR (jsonb_typeof(${t.value}) = 'string' AND ${t.value} #>> '{}' ~ '^[A-Z]{3}$')`,
    ),
  ],
);

export const plans = pgTable(
  "plans",
  {
    id: serial("id").primaryKey(),
    title: text("title").notNull(),
    purpose: text("purpose").notNull().default(""),
    ownerId: integer("owner_id")
      .notNull()
      .references(() => users.id),
    modelId: integer("model_id")
      .notNull()
      .references(() => modelProfiles.id, { onDelete: "restrict" }),
    requiredApprovals: integer("required_approvals").notNull().default(1),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    /**
     * The latest revision's number and state, the newest approved revision, and that revision's proof (null: not yet
     * decided, or none approved), stored so lists read and filter one row per plan. A trigger on plan_revisions
     * (plans_keep_latest, migrations 0013 and 0024) keeps them in the statement that changes a revision's state,
     * number or proof, whichever code path does it.
     */
    latestNumber: integer("latest_number").notNull().default(1),
    latestState: text("latest_state").$type<RevisionState>().notNull().default("draft"),
    approvedNumber: integer("approved_number"),
    approvedProof: text("approved_proof").$type<ProofState>(),
  },
  (t) => [
    // One index per sort key of the plans list (id breaks ties, so a page is a range scan).
    index("plans_updated_idx").on(t.updatedAt, t.id),
    index("plans_created_idx").on(t.createdAt, t.id),
    index("plans_title_idx").on(sql`lower(${t.title})`, t.id),
    index("plans_state_idx").on(t.latestState, t.id),
    index("plans_state_updated_idx").on(t.latestState, t.updatedAt, t.id),
    index("plans_owner_idx").on(t.ownerId, t.updatedAt, t.id),
    index("plans_model_idx").on(t.modelId, t.updatedAt, t.id),
    // The proof filter on plans with an approved revision ("none" is a null proof here), beside the state and the
    // default sort: proof with a state is one range for its page and its count (docs/scale-figures.md).
    index("plans_proof_idx")
      .on(t.approvedProof, t.latestState, t.updatedAt, t.id)
      .where(sql`${t.approvedNumber} IS NOT NULL`),
    // Trigram indexes make ILIKE '%…%' an index search (pg_trgm, created by the migration).
    index("plans_title_trgm").using("gin", t.title.op("gin_trgm_ops")),
    index("plans_purpose_trgm").using("gin", t.purpose.op("gin_trgm_ops")),
    check("plans_latest_state_known", sql`${t.latestState} IN (${inList(REVISION_STATES)})`),
    // A proof belongs to the approved revision: none without one.
    check(
      "plans_approved_proof_known",
      sql`${t.approvedProof} IS NULL OR (${t.approvedNumber} IS NOT NULL AND ${t.approvedProof} IN (${inList(PROOF_STATES)}))`,
    ),
  ],
);

/** Content is immutable once submitted; contentHash = SHA-256 of its RFC 8785 canonical form. */
export const planRevisions = pgTable(
  "plan_revisions",
  {
    id: serial("id").primaryKey(),
    planId: integer("plan_id")
      .notNull()
      .references(() => plans.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    state: text("state").$type<RevisionState>().notNull().default("draft"),
    version: integer("version").notNull().default(1),
    round: integer("round").notNull().default(0),
    authorId: integer("author_id")
      .notNull()
      .references(() => users.id),
    content: jsonb("content").notNull(),
    contentHash: text("content_hash").notNull(),
    engineVersion: text("engine_version").notNull(),
    /** SHA-256 of the final block's rotary layout (docs/fingerprint.md); kept beside the content, outside its hash. */
    rotaryFingerprint: text("rotary_fingerprint"),
    /** Complete supported length of each base the plan adopts (base-support.ts); beside the content, outside its hash. */
    baseSupport: jsonb("base_support"),
    /** After approval: proven or unproven by the latest proof decision (revision_proofs); null until one is made. */
    proof: text("proof").$type<ProofState>(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    submittedAt: timestamp("submitted_at", { withTimezone: true }),
    decidedAt: timestamp("decided_at", { withTimezone: true }),
  },
  (t) => [
    uniqueIndex("plan_revisions_plan_number").on(t.planId, t.number),
    index("plan_revisions_state").on(t.state),
    // The review queue: revisions in review, oldest submission first. Author and round ride along so the queue's
    // capped count (not the approver's own, not yet decided by them) is an index-only scan, not a heap page per revision.
    index("plan_revisions_in_review")
      .on(t.submittedAt, t.id, t.authorId, t.round)
      .where(sql`${t.state} = 'in_review'`),
    // Proven or unproven revisions, and approved ones with no proof decision yet. The plan list's proof filter read
    // these until migration 0024 stored the approved revision's proof on plans (plans_proof_idx); no list reads them
    // now (docs/scale-figures.md), and they stay until a measured reason says whether to drop them.
    index("plan_revisions_proof")
      .on(t.proof, t.planId, t.number)
      .where(sql`${t.proof} IS NOT NULL`),
    index("plan_revisions_unproven")
      .on(t.planId, t.number)
      .where(sql`${t.state} = 'approved' AND ${t.proof} IS NULL`),
    // A plan holds at most one approved revision: approving one supersedes the others (workflow.service decide,
    // shared/plan-rules latestApproved). The stored plans.approved_proof (the plan list's proof filter) relies on it.
    uniqueIndex("plan_revisions_one_approved")
      .on(t.planId)
      .where(sql`${t.state} = 'approved'`),
    // The column stays text (no type change under live triggers); the CHECK keeps it to the shared list.
    check("plan_revisions_state_known", sql`${t.state} IN (${inList(REVISION_STATES)})`),
    // Proof follows approval: only an approved (or later superseded) revision carries one.
    check("plan_revisions_proof_known", sql`${t.proof} IS NULL OR ${t.proof} IN (${inList(PROOF_STATES)})`),
    check("plan_revisions_proof_after_approval", sql`${t.proof} IS NULL OR ${t.state} IN ('approved', 'superseded')`),
  ],
);

/** One decision per approver per submission round of a revision. */
export const planDecisions = pgTable(
  "plan_decisions",
  {
    id: serial("id").primaryKey(),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => planRevisions.id, { onDelete: "cascade" }),
    round: integer("round").notNull(),
    approverId: integer("approver_id")
      .notNull()
      .references(() => users.id),
    decision: text("decision").$type<(typeof DECISIONS)[number]>().notNull(),
    comment: text("comment").notNull().default(""),
    signedHash: text("signed_hash").notNull(),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
    /** Base64 Ed25519 signature by the server key over {planId, revision, contentHash, approverId, decision, round, time}; null only for rows older than signing. */
    signature: text("signature"),
    /** SHA-256 of the signing public key (DER SubjectPublicKeyInfo), hex. */
    keyId: text("key_id"),
  },
  (t) => [
    uniqueIndex("plan_decisions_once").on(t.revisionId, t.round, t.approverId),
    check("plan_decisions_decision_known", sql`${t.decision} IN (${inList(DECISIONS)})`),
  ],
);

/** Personal API tokens; only the SHA-256 of the secret is stored. Scopes are checked against shared/schemas/tokens.ts. */
export const apiTokens = pgTable("api_tokens", {
  id: serial("id").primaryKey(),
  userId: integer("user_id")
    .notNull()
    .references(() => users.id),
  name: text("name").notNull(),
  tokenHash: text("token_hash").notNull().unique(),
  prefix: text("prefix").notNull(),
  // Tokens made before scopes existed keep their old meaning: read-only export.
  scopes: text("scopes")
    .array()
    .notNull()
    .default(sql`ARRAY['export:read']::text[]`),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  lastUsedAt: timestamp("last_used_at", { withTimezone: true }),
  revokedAt: timestamp("revoked_at", { withTimezone: true }),
});

/** Mail waits here until delivered; rows are claimed with FOR UPDATE SKIP LOCKED so instances never send one twice. */
export const mailOutbox = pgTable(
  "mail_outbox",
  {
    id: serial("id").primaryKey(),
    kind: text("kind").notNull(),
    toAddresses: text("to_addresses").array().notNull(),
    subject: text("subject").notNull(),
    body: text("body").notNull(),
    status: text("status").notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    lastError: text("last_error"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    sentAt: timestamp("sent_at", { withTimezone: true }),
    /** The plan and revision the message is about (workflow mail), so the Mail page lays deliveries out per plan. */
    planId: integer("plan_id").references(() => plans.id, { onDelete: "set null" }),
    revision: integer("revision"),
  },
  (t) => [
    index("mail_outbox_due").on(t.status, t.nextAttemptAt),
    index("mail_outbox_plan").on(t.planId, t.revision),
    // The Mail page's search (subject or recipient), as for the received messages below.
    index("mail_outbox_subject_trgm").using("gin", t.subject.op("gin_trgm_ops")),
    index("mail_outbox_to_trgm").using("gin", sql`rw_text_list(${t.toAddresses}) gin_trgm_ops`),
  ],
);

/** What the local SMTP sink received (development and tests only). */
export const mailSinkMessages = pgTable(
  "mail_sink_messages",
  {
    id: serial("id").primaryKey(),
    receivedAt: timestamp("received_at", { withTimezone: true }).notNull().defaultNow(),
    messageId: text("message_id"),
    fromAddress: text("from_address").notNull(),
    toAddresses: text("to_addresses").array().notNull(),
    subject: text("subject").notNull(),
    text: text("text").notNull(),
    raw: text("raw").notNull(),
  },
  (t) => [
    index("mail_sink_subject_trgm").using("gin", t.subject.op("gin_trgm_ops")),
    // rw_text_list is an IMMUTABLE array_to_string (migration 0013); the Mail page's search uses the same expression.
    index("mail_sink_to_trgm").using("gin", sql`rw_text_list(${t.toAddresses}) gin_trgm_ops`),
  ],
);
