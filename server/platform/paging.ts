import { sql, type SQL } from "drizzle-orm";
import type { Executor } from "../db/client";
import { Invalid } from "./errors";

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

/**
 * The deepest page a list answers by number (an OFFSET): the last one its capped total can name. An OFFSET walks every
 * row before the page, so without this a request for page 2 000 cost forty times page 50; past it the pager has
 * already stopped naming pages ("10,000+") and moves by keyset cursor, so the bound costs no reachable page.
 */
export const deepestNumberedPage = (pageSize: number, cap = TOTAL_CAP) => Math.ceil(cap / pageSize);

/**
 * A page number the list answers by OFFSET, or a 400 naming `page` past deepestNumberedPage. `noun` names the list's rows
 * and `readOn` how to go deeper by the list's keyset cursor, for the message. Lists call it only when no cursor is given
 * (with one the number only labels the page).
 */
export function checkNumberedPage(page: number, pageSize: number, noun: string, readOn: string) {
  const deepest = deepestNumberedPage(pageSize);
  if (page > deepest)
    throw new Invalid(
      `page: pages by number stop at ${deepest} (${TOTAL_CAP} ${noun} at ${pageSize} a page); read on with ${readOn}`,
      { page: `at most ${deepest} without a cursor` },
    );
}

/** A page request in rows: `page` counts from 1. */
export const pageWindow = (page: number, pageSize: number) => ({ limit: pageSize, offset: (page - 1) * pageSize });

/**
 * Keyset paging for a list ordered on (a sort key, id): the cursor names the last row shown by that key, as text the
 * database reads back to the same value, and its id; the next page is the rows strictly after it in the list's order.
 * Every page then costs what the first does, however deep, where an OFFSET walks every row before the page. The
 * cursor also names the order it was read in: under another order "after this row" means something else, so it is
 * refused there rather than answering a page that skips or repeats rows.
 */
export interface KeysetCursor {
  order: string;
  key: string;
  id: number;
}

/** An opaque token (base64url JSON) for the row a page ended on. */
export const encodeCursor = (c: KeysetCursor) =>
  Buffer.from(JSON.stringify([c.order, c.key, c.id]), "utf8").toString("base64url");

/** Row ids are PostgreSQL `integer`s (serial): a larger one fails the cursor's cast in the database. */
const MAX_ROW_ID = 2 ** 31 - 1;

/** The 400 for a cursor token this list could not have given out. */
export const notOurCursor = (field: string) =>
  new Invalid(`${field}: not a cursor this list gave out`, { [field]: "not a cursor this list gave out" });

/** The cursor behind `token`, or a 400 naming `field` when it is not one this list gave out for `order`. */
export function decodeCursor(token: string, order: string, field: string): KeysetCursor {
  let parts: unknown;
  try {
    parts = JSON.parse(Buffer.from(token, "base64url").toString("utf8"));
  } catch {
    parts = undefined;
  }
  if (
    !Array.isArray(parts) ||
    parts.length !== 3 ||
    typeof parts[0] !== "string" ||
    typeof parts[1] !== "string" ||
    !Number.isSafeInteger(parts[2]) ||
    (parts[2] as number) < 1 ||
    (parts[2] as number) > MAX_ROW_ID
  )
    throw notOurCursor(field);
  if (parts[0] !== order)
    throw new Invalid(`${field}: the cursor was read under another sort order; start again from page 1`, {
      [field]: "read under another sort order",
    });
  return { order, key: parts[1], id: parts[2] as number };
}

/**
 * The rows after a cursor in an order of (key, id), both ascending or both descending: a row comparison, which a
 * btree index on (key, id) answers as one range. `key` is an SQL expression of the list's rows; `value` the cursor's
 * key cast back to that expression's type. The bare bound on the key repeats what the row comparison implies, so that
 * a key from a joined table (an owner's or model's name) still starts its index walk at the cursor.
 */
export function keysetAfter(key: SQL, id: SQL, dir: "asc" | "desc", value: SQL, cursorId: number) {
  const [strict, loose] = dir === "asc" ? [sql.raw(">"), sql.raw(">=")] : [sql.raw("<"), sql.raw("<=")];
  return sql`(${key}, ${id}) ${strict} (${value}, ${cursorId}::int) AND ${key} ${loose} ${value}`;
}
