import { and, desc, eq, gte, inArray, like, lt, lte, type SQL } from "drizzle-orm";
import type { z } from "zod";
import type { AppDeps } from "../../deps";
import { auditEvents, users } from "../../db/schema";
import type { auditQuerySchema } from "../../../shared/schemas";
import type { AuditPage } from "../../../shared/schemas/audit";
import { verifyAuditChain } from "../../platform/audit-chain";
import { cappedCount } from "../../platform/paging";

/**
 * One page of the append-only trail, newest first, filtered; actors by name. With `before` the page is a keyset range
 * (id < before) on the primary key, so the thousandth page costs what the first does; without it `page` is an OFFSET,
 * kept for links into the first pages. The page's ids are chosen first and only its rows meet the users table.
 */
export async function listAuditEvents(deps: AppDeps, q: z.output<typeof auditQuerySchema>): Promise<AuditPage> {
  const where: SQL[] = [];
  if (q.action) where.push(like(auditEvents.action, `${q.action.replace(/[\\%_]/g, (c) => `\\${c}`)}%`));
  if (q.actorId) where.push(eq(auditEvents.actorId, q.actorId));
  if (q.subjectType) where.push(eq(auditEvents.subjectType, q.subjectType));
  if (q.subjectId) where.push(eq(auditEvents.subjectId, q.subjectId));
  if (q.from) where.push(gte(auditEvents.at, new Date(q.from)));
  if (q.to) where.push(lte(auditEvents.at, new Date(q.to)));
  const filtered = where.length ? and(...where) : undefined;
  const pageIds = deps.db
    .select({ id: auditEvents.id })
    .from(auditEvents)
    .where(q.before ? and(filtered, lt(auditEvents.id, q.before)) : filtered)
    .orderBy(desc(auditEvents.id))
    .limit(q.pageSize)
    .offset(q.before ? 0 : (q.page - 1) * q.pageSize);
  const [rows, count] = await Promise.all([
    deps.db
      .select({ e: auditEvents, name: users.name })
      .from(auditEvents)
      .leftJoin(users, eq(users.id, auditEvents.actorId))
      .where(inArray(auditEvents.id, pageIds))
      .orderBy(desc(auditEvents.id)),
    cappedCount(deps.db, deps.db.select({ one: auditEvents.id }).from(auditEvents).where(filtered).getSQL()),
  ]);
  const last = rows[rows.length - 1];
  return {
    ...count,
    nextBefore: rows.length === q.pageSize && last ? last.e.id : null,
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
