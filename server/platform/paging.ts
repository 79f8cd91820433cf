import { sql, type SQL } from "drizzle-orm";
import type { Executor } from "../db/client";

/**
 * Lists count matching rows only up to this many. An exact count(*) reads every matching row, so its cost grows
 * with the table whatever page is shown; past the cap the answer says "at least" (`totalCapped`) and the pager
 * offers the next page instead of a last one.
 */
export const TOTAL_CAP = 10_000;

/** Rows of `rows` (a SELECT), counted up to TOTAL_CAP: `{ total, totalCapped }`. */
export async function cappedCount(ex: Executor, rows: SQL, cap = TOTAL_CAP) {
  const res = await ex.execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM (${rows} LIMIT ${cap + 1}) capped`);
  return cappedTotal(res.rows[0]?.n ?? 0, cap);
}

/** A count taken with `LIMIT cap + 1` as the list answers it. */
export const cappedTotal = (n: number, cap = TOTAL_CAP) => ({ total: Math.min(n, cap), totalCapped: n > cap });

/** ILIKE treats % and _ as wildcards; a search for "a_b" means those three characters. */
export const containsPattern = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/** A page request in rows: `page` counts from 1. */
export const pageWindow = (page: number, pageSize: number) => ({ limit: pageSize, offset: (page - 1) * pageSize });
