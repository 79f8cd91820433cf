import { and, asc, desc, eq, gt, gte, inArray, like, lt, lte, type SQL } from "drizzle-orm";
import type { z } from "zod";
import type { AppDeps } from "../../deps";
import { auditEvents, users } from "../../db/schema";
import type { auditQuerySchema } from "../../../shared/schemas";
import type { AuditPage } from "../../../shared/schemas/audit";
import { verifyAuditChain } from "../../platform/audit-chain";
import { cappedCount, checkNumberedPage } from "../../platform/paging";

/**
 * One page of the append-only trail, newest first, filtered; actors by name. With `before` the page is a keyset range
 * (id < before) on the primary key, so the thousandth page costs what the first does; without it `page` is an OFFSET,
 * kept for links into the first pages and answered only as deep as the capped total names pages (checkNumberedPage,
 * as the plan list). The page's ids are chosen first and only its rows meet the users table.
 */
export async function listAuditEvents(deps: AppDeps, q: z.output<typeof auditQuerySchema>): Promise<AuditPage> {
  if (q.before === undefined) checkNumberedPage(q.page, q.pageSize, "events", "before= (the page's nextBefore)");
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
  /*
   * The page above this one by cursor: the matching events newer than this page are those from `before` up (nothing
   * matching lies between `before` and the page's first event), or, on a page read by number, those after its first
   * event. The (pageSize + 1)-th oldest of them is the `before` whose page is the pageSize events just above; with
   * fewer, the page above is the first, read without a cursor. One primary-key range, pageSize + 1 rows.
   */
  const above = (newer: SQL) =>
    deps.db
      .select({ id: auditEvents.id })
      .from(auditEvents)
      .where(and(filtered, newer))
      .orderBy(asc(auditEvents.id))
      .limit(1)
      .offset(q.pageSize)
      .then((r) => r[0]?.id ?? null);
  const [rows, count, prevByCursor] = await Promise.all([
    deps.db
      .select({ e: auditEvents, name: users.name })
      .from(auditEvents)
      .leftJoin(users, eq(users.id, auditEvents.actorId))
      .where(inArray(auditEvents.id, pageIds))
      .orderBy(desc(auditEvents.id)),
    cappedCount(deps.db, deps.db.select({ one: auditEvents.id }).from(auditEvents).where(filtered).getSQL()),
    q.before === undefined ? null : above(gte(auditEvents.id, q.before)),
  ]);
  const first = rows[0];
  const last = rows[rows.length - 1];
  const prevBefore =
    q.before !== undefined ? prevByCursor : q.page > 1 && first ? await above(gt(auditEvents.id, first.e.id)) : null;
  return {
    ...count,
    nextBefore: rows.length === q.pageSize && last ? last.e.id : null,
    prevBefore,
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
