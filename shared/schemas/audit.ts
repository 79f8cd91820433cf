import { z } from "zod";
import { dbIdParam, MAX_DB_ID, pagedTotal } from "./common";

export const auditQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(MAX_DB_ID).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
  /**
   * Keyset paging: events older than this id (the previous page's `nextBefore`, or the shown page's `prevBefore`); `page`
   * then only labels the page. Without it `page` is an OFFSET, answered up to ceil(10 000 / pageSize) (a 400 naming
   * `page` beyond: server/platform/paging.ts checkNumberedPage).
   */
  before: dbIdParam.optional(),
  action: z.string().max(80).optional(),
  actorId: dbIdParam.optional(),
  subjectType: z.string().max(40).optional(),
  subjectId: z.string().max(40).optional(),
  from: z.iso.datetime({ offset: true }).optional(),
  to: z.iso.datetime({ offset: true }).optional(),
});
export type AuditQuery = z.input<typeof auditQuerySchema>;

export const auditEventSchema = z.object({
  id: z.number(),
  at: z.string(),
  actor: z.object({ id: z.number(), name: z.string() }).nullable(),
  action: z.string(),
  subjectType: z.string(),
  subjectId: z.string().nullable(),
  detail: z.record(z.string(), z.unknown()),
});
export type AuditEvent = z.infer<typeof auditEventSchema>;

/** GET /api/audit/verify: the whole hash chain checked, or the first link that does not hold. */
export const auditChainReportSchema = z.object({
  ok: z.boolean(),
  /** Rows checked and found linked, up to (not including) the first broken one. */
  count: z.number().int(),
  brokenAt: z
    .object({
      id: z.number().int(),
      /** previous_hash_mismatch: a row before it was removed or replaced; hash_mismatch: this row was changed. */
      reason: z.enum(["previous_hash_mismatch", "hash_mismatch"]),
      /** The last row that still links, or null when the break is at the start. */
      previousId: z.number().int().nullable(),
    })
    .optional(),
});
export type AuditChainReport = z.infer<typeof auditChainReportSchema>;

/** GET /api/audit (server/features/audit/audit.router.ts). */
export const auditPageSchema = z.object({
  ...pagedTotal,
  /** Pass as `before` for the next page: keyset paging, as cheap at any depth (null on the last page). */
  nextBefore: z.number().nullable(),
  /**
   * Pass as `before` for the page above (newer events): keyset paging backwards, so "Previous page" works at any depth,
   * where a page number is answered only up to the capped total. Null when the page above is the first (no cursor).
   */
  prevBefore: z.number().nullable(),
  page: z.number(),
  pageSize: z.number(),
  events: z.array(auditEventSchema),
});
export type AuditPage = z.infer<typeof auditPageSchema>;
