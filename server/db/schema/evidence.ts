import { sql } from "drizzle-orm";
import { check, customType, index, integer, jsonb, pgTable, serial, text, timestamp } from "drizzle-orm/pg-core";
import { EVIDENCE_KINDS } from "../../../shared/schemas/evidence";
import { PROOF_STATES } from "../../../shared/schemas/evidence-api";
import { users } from "./users";
import { planRevisions, plans } from "./plans";
import { inList } from "./sql-lists";

const bytea = customType<{ data: Buffer }>({ dataType: () => "bytea" });

/**
 * Evaluation results uploaded against an approved revision (issue 12). The file is kept as sent, with its SHA-256, so
 * it can be downloaded and re-parsed; `rows` is what the parser read from it. Append-only for the app role.
 */
export const revisionEvidence = pgTable(
  "revision_evidence",
  {
    id: serial("id").primaryKey(),
    planId: integer("plan_id")
      .notNull()
      .references(() => plans.id, { onDelete: "cascade" }),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => planRevisions.id, { onDelete: "cascade" }),
    kind: text("kind").notNull(),
    fileName: text("file_name").notNull(),
    format: text("format").$type<"csv" | "harness">().notNull(),
    content: bytea("content").notNull(),
    checksum: text("checksum").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    rows: jsonb("rows").notNull(),
    fingerprint: text("fingerprint").notNull(),
    provenance: jsonb("provenance").notNull(),
    byUserId: integer("by_user_id")
      .notNull()
      .references(() => users.id),
    via: text("via").$type<"session" | "token">().notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("revision_evidence_revision").on(t.revisionId, t.id),
    check("revision_evidence_kind_known", sql`${t.kind} IN (${inList(EVIDENCE_KINDS)})`),
    check("revision_evidence_format_known", sql`${t.format} IN ('csv', 'harness')`),
    check("revision_evidence_checksum_hex", sql`${t.checksum} ~ '^[0-9a-f]{64}$'`),
  ],
);

/**
 * Proof decisions on an approved revision: an approver reads the verdicts and marks it proven (every criterion passes)
 * or unproven (with a reason). Signed like approvals, over the content hash and the evidence ids read. Append-only.
 */
export const revisionProofs = pgTable(
  "revision_proofs",
  {
    id: serial("id").primaryKey(),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => planRevisions.id, { onDelete: "cascade" }),
    approverId: integer("approver_id")
      .notNull()
      .references(() => users.id),
    verdict: text("verdict").notNull(),
    reason: text("reason").notNull().default(""),
    contentHash: text("content_hash").notNull(),
    evidenceIds: integer("evidence_ids").array().notNull(),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
    signature: text("signature").notNull(),
    keyId: text("key_id").notNull(),
  },
  (t) => [
    index("revision_proofs_revision").on(t.revisionId, t.id),
    check("revision_proofs_verdict_known", sql`${t.verdict} IN (${inList(PROOF_STATES)})`),
  ],
);
