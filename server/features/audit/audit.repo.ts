import { auditEvents } from "../../db/schema";
import type { Executor } from "../../db/client";

export interface AuditEntry {
  actorId: number | null;
  action: string;
  subjectType: string;
  subjectId?: string | number | null;
  detail?: Record<string, unknown>;
}

/** Writes one audit event with the caller's executor, so it commits or rolls back with the change it records. */
export async function recordAudit(ex: Executor, entry: AuditEntry) {
  await ex.insert(auditEvents).values({
    actorId: entry.actorId,
    action: entry.action,
    subjectType: entry.subjectType,
    subjectId: entry.subjectId == null ? null : String(entry.subjectId),
    detail: entry.detail ?? {},
  });
}
