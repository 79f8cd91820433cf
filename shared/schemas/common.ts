import { z } from "zod";
// Side effect: our own validation wording for every parse (see the module).
import "../validation-messages";

/** Every error the API returns has this shape. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof apiErrorSchema>;

export const ROLES = ["admin", "researcher", "infra", "approver", "viewer"] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

/**
 * Ids are PostgreSQL `integer` (int4) columns: 1 … 2^31 − 1. A larger id can name no row, and PostgreSQL refuses it
 * outright ("out of range for type integer"), so it is a 400 on the field here, never a query.
 */
export const MAX_DB_ID = 2 ** 31 - 1;
export const dbIdSchema = z.number().int().positive().max(MAX_DB_ID, `ids are at most ${MAX_DB_ID}`);
/** A SHA-256 digest as lowercase hex: content hashes and rotary fingerprints are both written this way. */
export const SHA256_HEX = /^[0-9a-f]{64}$/;
/** SHA-256 hex, as the server computes content hashes. */
export const contentHashSchema = z.string().regex(SHA256_HEX, "a SHA-256 content hash: 64 lowercase hex characters");

/** The same id as it arrives in a path or query string. */
export const dbIdParam = z.coerce.number().int().positive().max(MAX_DB_ID, `ids are at most ${MAX_DB_ID}`);
export const idParamSchema = z.object({ id: dbIdParam });

/** GET /api/health: 200 when PostgreSQL answers, 503 (same shape) when it does not. */
export const healthResponseSchema = z.object({ ok: z.boolean(), db: z.enum(["up", "down"]) });

/** `total` counts matches up to a cap; `totalCapped` says there are more (server/platform/paging.ts). */
export const pagedTotal = { total: z.number(), totalCapped: z.boolean() };

/** `?page=&pageSize=` for lists that used to answer every row; page counts from 1. */
export const pageQuerySchema = (defaultSize: number, maxSize = 200) =>
  z.object({
    page: z.coerce.number().int().min(1).max(MAX_DB_ID).default(1),
    pageSize: z.coerce.number().int().min(1).max(maxSize).default(defaultSize),
  });
