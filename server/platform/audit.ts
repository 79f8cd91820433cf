import { sql } from "drizzle-orm";
import { PgTransaction } from "drizzle-orm/pg-core";
import { auditEvents } from "../db/schema";
import type { Executor, Tx } from "../db/client";
import { AT_TEXT, auditRowHash, CHAIN_LOCK_SQL, GENESIS_HASH } from "./audit-chain";

export interface AuditEntry {
  actorId: number | null;
  action: string;
  subjectType: string;
  subjectId?: string | number | null;
  detail?: Record<string, unknown>;
}

/**
 * Writes one audit event with the caller's executor, so it commits or rolls back with the change it records.
 * The row is linked into the hash chain (audit-chain.ts) under a lock held until that transaction ends; a caller
 * without a transaction gets a short one of its own, since the lock must cover the read of the last hash and the insert.
 */
export async function recordAudit(ex: Executor, entry: AuditEntry) {
  if (ex instanceof PgTransaction) return appendLinked(ex as Tx, entry);
  return ex.transaction((tx) => appendLinked(tx, entry));
}

async function appendLinked(tx: Tx, entry: AuditEntry) {
  // A JSON round trip drops undefined and turns dates into strings, exactly as the jsonb column will see them.
  const detailJson = JSON.stringify(entry.detail ?? {});
  await tx.execute(CHAIN_LOCK_SQL);
  const head = (
    await tx.execute<{ id: string; at: string; detail: string; prev: string | null }>(sql`
    SELECT nextval(pg_get_serial_sequence('audit_events', 'id'))::text AS id, ${AT_TEXT("now()")} AS at,
           ${detailJson}::jsonb::text AS detail, (SELECT hash FROM audit_events ORDER BY id DESC LIMIT 1) AS prev`)
  ).rows[0];
  const row = {
    id: Number(head.id),
    at: head.at,
    actorId: entry.actorId,
    action: entry.action,
    subjectType: entry.subjectType,
    subjectId: entry.subjectId == null ? null : String(entry.subjectId),
    detail: head.detail,
    prevHash: head.prev ?? GENESIS_HASH,
  };
  await tx.insert(auditEvents).values({
    id: row.id,
    at: sql`${row.at}::timestamptz`,
    actorId: row.actorId,
    action: row.action,
    subjectType: row.subjectType,
    subjectId: row.subjectId,
    detail: sql`${detailJson}::jsonb`,
    prevHash: row.prevHash,
    hash: auditRowHash(row),
  });
}
