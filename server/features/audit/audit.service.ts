import { and, desc, eq, gte, like, lte, sql, type SQL } from "drizzle-orm";
import type { z } from "zod";
import type { AppDeps } from "../../deps";
import { auditEvents, users } from "../../db/schema";
import type { auditQuerySchema } from "../../../shared/schemas";
import type { AuditPage } from "../../../shared/schemas/audit";
import { verifyAuditChain } from "../../platform/audit-chain";

/** One page of the append-only trail, newest first, filtered; actors by name. */
export async function listAuditEvents(deps: AppDeps, q: z.output<typeof auditQuerySchema>): Promise<AuditPage> {
  const where: SQL[] = [];
  if (q.action) where.push(like(auditEvents.action, `${q.action.replace(/[\\%_]/g, (c) => `\\${c}`)}%`));
  if (q.actorId) where.push(eq(auditEvents.actorId, q.actorId));
  if (q.subjectType) where.push(eq(auditEvents.subjectType, q.subjectType));
  if (q.subjectId) where.push(eq(auditEvents.subjectId, q.subjectId));
  if (q.from) where.push(gte(auditEvents.at, new Date(q.from)));
  if (q.to) where.push(lte(auditEvents.at, new Date(q.to)));
  const rows = await deps.db
    .select({ e: auditEvents, name: users.name, total: sql<number>`count(*) OVER ()::int` })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(where.length ? and(...where) : undefined)
    .orderBy(desc(auditEvents.id))
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize);
  return {
    total: rows[0]?.total ?? 0,
    page: q.page,
    pageSize: q.pageSize,
    events: rows.map(({ e, name }) => ({
      id: e.id,
      at: e.at.toISOString(),
      actor: e.actorId ? { id: e.actorId, name: name ?? "?" } : null,
      action: e.action,
      subjectType: e.subjectType,
      subjectId: e.subjectId,
      detail: e.detail as Record<string, unknown>,
    })),
  };
}

/** One snapshot for the whole walk, so rows appended meanwhile neither count nor confuse it. */
export const verifyTrail = (deps: AppDeps) =>
  deps.db.transaction((tx) => verifyAuditChain(tx), { isolationLevel: "repeatable read", accessMode: "read only" });
