import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import { sql } from "drizzle-orm";
import type { Executor } from "../db/client";
import type { AuditChainReport } from "../../shared/schemas/audit";

/** prev_hash of the first row: there is no predecessor. */
export const GENESIS_HASH = "0".repeat(64);

/**
 * Appends queue on this transaction-scoped advisory lock, so two transactions never read the same last hash and
 * fork the chain. The app role cannot lock audit rows FOR UPDATE (that needs UPDATE), hence an advisory lock.
 * hashtext() only has to agree with itself on one server.
 */
export const CHAIN_LOCK_SQL = sql`SELECT pg_advisory_xact_lock(hashtext('ropewalk.audit_events.chain'))`;

/**
 * Columns as the chain hashes them, rendered by PostgreSQL so both sides see one text: the time in UTC with
 * microseconds (JavaScript dates keep only milliseconds) and the jsonb's own text form of detail.
 */
export const AT_TEXT = (col: string) => sql.raw(`to_char(${col} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`);

export interface ChainFields {
  id: number;
  at: string;
  actorId: number | null;
  action: string;
  subjectType: string;
  subjectId: string | null;
  /** The jsonb text of detail, as PostgreSQL prints it. */
  detail: string;
  prevHash: string;
}

/**
 * SHA-256 (hex) of the RFC 8785 canonical JSON (Rundgren, Jordan, Erdtman 2020) of the row's fields. The migration
 * *_audit_hash_chain.sql builds the same bytes in SQL to chain rows written before the chain existed.
 */
export function auditRowHash(f: ChainFields): string {
  const envelope = canonicalize({
    action: f.action,
    actorId: f.actorId,
    at: f.at,
    detail: f.detail,
    id: f.id,
    prevHash: f.prevHash,
    subjectId: f.subjectId,
    subjectType: f.subjectType,
  });
  return createHash("sha256").update(envelope!, "utf8").digest("hex");
}

interface StoredRow extends ChainFields {
  hash: string;
  [key: string]: unknown;
}

const BATCH = 2000;

/**
 * Walks the whole chain in id order and stops at the first broken link: a row whose prev_hash is not its
 * predecessor's hash (a row before it was removed, inserted or re-hashed) or whose own hash does not match its
 * fields (the row was changed). A removed last row leaves no trace in a chain alone.
 */
export async function verifyAuditChain(ex: Executor): Promise<AuditChainReport> {
  let prev = GENESIS_HASH;
  let lastId = 0;
  let count = 0;
  for (;;) {
    const rows = (
      await ex.execute<StoredRow>(sql`
      SELECT id::float8 AS "id", ${AT_TEXT("at")} AS "at", actor_id AS "actorId", action, subject_type AS "subjectType",
             subject_id AS "subjectId", detail::text AS "detail", prev_hash AS "prevHash", hash
      FROM audit_events WHERE id > ${lastId} ORDER BY id LIMIT ${BATCH}`)
    ).rows;
    for (const row of rows) {
      if (row.prevHash !== prev) {
        return {
          ok: false,
          count,
          brokenAt: { id: row.id, reason: "previous_hash_mismatch", previousId: lastId || null },
        };
      }
      if (auditRowHash(row) !== row.hash) {
        return { ok: false, count, brokenAt: { id: row.id, reason: "hash_mismatch", previousId: lastId || null } };
      }
      prev = row.hash;
      lastId = row.id;
      count++;
    }
    if (rows.length < BATCH) return { ok: true, count };
  }
}
