import { sql, type SQL } from "drizzle-orm";
import type { Executor } from "../../db/client";
import type { planListQuerySchema, RevisionState } from "../../../shared/schemas";
import type { z } from "zod";
import type { ProofState } from "../../../shared/schemas/evidence-api";
import { Invalid } from "../../platform/errors";
import {
  cappedCount,
  cappedTotal,
  containsPattern,
  checkNumberedPage,
  decodeCursor,
  encodeCursor,
  keysetAfter,
  notOurCursor,
  TOTAL_CAP,
} from "../../platform/paging";

type Query = z.output<typeof planListQuerySchema>;

/**
 * Sort keys, each backed by an index (server/db/schema/plans.ts) so a page is a short index range; owner and model
 * sort through an index on the name. Keys come from this fixed table, never from input. `cursorText` prints the key for a
 * keyset cursor as text that casts back to the same value: timestamps in UTC to the microsecond (a JavaScript Date
 * keeps milliseconds only, which would skip or repeat rows sharing one).
 */
const SORT: Record<Query["sort"], { key: string; type: "timestamptz" | "text" }> = {
  updatedAt: { key: "p.updated_at", type: "timestamptz" },
  createdAt: { key: "p.created_at", type: "timestamptz" },
  title: { key: "lower(p.title)", type: "text" },
  state: { key: "p.latest_state", type: "text" },
  owner: { key: "lower(u.name)", type: "text" },
  model: { key: "lower(m.name)", type: "text" },
};

const cursorText = (sort: Query["sort"]) => {
  const { key, type } = SORT[sort];
  return sql.raw(type === "timestamptz" ? `to_char(${key} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')` : key);
};

/**
 * Whether a cursor's timestamp key is one cursorText could have written (UTC, to the microsecond, a real calendar
 * time): anything else would fail its cast in the database. The round trip through Date refuses 30 February, which
 * Date.parse alone rolls over.
 */
const isCursorTimestamp = (key: string) =>
  /^[1-9]\d{3}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{6}Z$/.test(key) &&
  !Number.isNaN(Date.parse(key)) &&
  new Date(Date.parse(key)).toISOString().slice(0, 19) === key.slice(0, 19);

/** The order a cursor belongs to: the sort key and direction. */
const orderName = (q: Query) => `${q.sort}.${q.dir}`;

/**
 * Where the page starts: after `q.after` (next page), or just before `q.before` (previous page, read backwards from the
 * cursor), or every row without a cursor (`page` is then an OFFSET).
 */
function cursorBound(q: Query): SQL {
  const token = q.after ?? q.before;
  if (!token) return sql`true`;
  const field = q.after ? "after" : "before";
  const c = decodeCursor(token, orderName(q), field);
  const { key, type } = SORT[q.sort];
  if ((type === "timestamptz" && !isCursorTimestamp(c.key)) || c.key.includes("\u0000")) throw notOurCursor(field);
  const value = type === "timestamptz" ? sql`${c.key}::timestamptz` : sql`${c.key}::text`;
  // Rows before the cursor in the list's order are the rows after it in the opposite order.
  const dir = q.after ? q.dir : q.dir === "asc" ? "desc" : "asc";
  return keysetAfter(sql.raw(key), sql`p.id`, dir, value, c.id);
}

/**
 * A request the list answers within its bound, or a 400 naming the field: both cursors at once, or a page number past
 * the deepest one an OFFSET serves (checkNumberedPage; deeper pages are reached by cursor).
 */
export function checkPageRequest(q: Query) {
  if (q.after && q.before)
    throw new Invalid("before: give after (next page) or before (previous page), not both", {
      before: "not with after",
    });
  if (!q.after && !q.before) checkNumberedPage(q.page, q.pageSize, "plans", "the page's nextAfter as after");
}

export type PlanListRow = {
  id: number;
  title: string;
  purpose: string;
  owner_id: number;
  owner_name: string;
  model_id: number;
  model_name: string;
  required_approvals: number;
  created_at: Date;
  updated_at: Date;
  latest_number: number;
  latest_state: RevisionState;
  approved_number: number | null;
  /** the approved revision's proof (null: none yet, or no approved revision) */
  approved_proof: ProofState | null;
  /** the row's sort key as a cursor carries it (cursorText) */
  sort_key: string;
};

/**
 * The proof filter on the plan's stored approved revision (plans.approved_number, approved_proof; kept by the
 * plans_keep_latest trigger, migration 0024). "none" is an approved revision without a proof decision yet. Both are
 * columns of plans, so with a state the page and the count are one range of plans_proof_idx, and beside any other
 * filter a plan is tested from its own row, not by a look-up of its revision (docs/scale-figures.md).
 */
const proofIs = (proof: NonNullable<Query["proof"]>) =>
  proof === "none"
    ? sql`p.approved_number IS NOT NULL AND p.approved_proof IS NULL`
    : sql`p.approved_number IS NOT NULL AND p.approved_proof = ${proof}`;

/**
 * Plans matching the filters, as conditions on `plans p` alone. The text search is a union of four trigram-indexed
 * look-ups (title, purpose, owner name, model name) rather than one OR over a four-table join, which no index serves.
 */
function filters(q: Query): SQL {
  const where: SQL[] = [sql`true`];
  if (q.state) where.push(sql`p.latest_state = ${q.state}`);
  if (q.proof) where.push(proofIs(q.proof));
  if (q.ownerId) where.push(sql`p.owner_id = ${q.ownerId}`);
  if (q.modelId) where.push(sql`p.model_id = ${q.modelId}`);
  if (q.q) {
    const like = containsPattern(q.q);
    where.push(sql`p.id IN (
      SELECT id FROM plans WHERE title ILIKE ${like} OR purpose ILIKE ${like}
      UNION SELECT id FROM plans WHERE owner_id IN (SELECT id FROM users WHERE name ILIKE ${like})
      UNION SELECT id FROM plans WHERE model_id IN (SELECT id FROM model_profiles WHERE name ILIKE ${like}))`);
  }
  return sql.join(where, sql` AND `);
}

/** The plan list's columns for the page's ids, joined only to the page's rows. */
const pageColumns = (q: Query) => sql`
    SELECT ${cursorText(q.sort)} AS sort_key, p.id, p.title, p.purpose, p.owner_id, u.name AS owner_name,
           p.model_id, m.name AS model_name, p.required_approvals, p.created_at, p.updated_at, p.latest_number,
           p.latest_state, p.approved_number, p.approved_proof`;
const pageJoins = sql`
    FROM page JOIN plans p ON p.id = page.id
    JOIN users u ON u.id = p.owner_id
    JOIN model_profiles m ON m.id = p.model_id`;

function pageOrder(q: Query) {
  const dir = q.dir === "asc" ? "ASC" : "DESC";
  const order = sql.raw(`${SORT[q.sort].key} ${dir}, p.id ${dir}`);
  // A previous page is chosen walking backwards from its cursor (one row more, to tell whether any come before it),
  // then shown in the list's order.
  const back = q.dir === "asc" ? "DESC" : "ASC";
  const pick = q.before ? sql.raw(`${SORT[q.sort].key} ${back}, p.id ${back}`) : order;
  // Owner and model sorts need the name to choose the page; the others choose it from plans alone.
  const sortJoin =
    q.sort === "owner"
      ? sql`JOIN users u ON u.id = p.owner_id`
      : q.sort === "model"
        ? sql`JOIN model_profiles m ON m.id = p.model_id`
        : sql``;
  // With a cursor the page starts at it (a range of the sort key's index); without one, `page` is an OFFSET, kept
  // for links into the first pages (its cost grows with the page number, bounded by checkPageRequest).
  const offset = q.after || q.before ? 0 : (q.page - 1) * q.pageSize;
  const rows = q.before ? q.pageSize + 1 : q.pageSize;
  return { order, pick, sortJoin, after: cursorBound(q), limit: sql`LIMIT ${rows} OFFSET ${offset}` };
}

/** A previous page's rows without the one read past its start, and whether any plans come before it. */
function trimmed(q: Query, rows: PlanListRow[]) {
  if (!q.before) return { rows, more: q.after !== undefined || q.page > 1 };
  return rows.length > q.pageSize ? { rows: rows.slice(1), more: true } : { rows, more: false };
}

const cursorOf = (q: Query, row: PlanListRow) => encodeCursor({ order: orderName(q), key: row.sort_key, id: row.id });

/** The cursor for the page before `rows` (null on the first page: nothing precedes it). */
const prevBefore = (q: Query, rows: PlanListRow[], more: boolean) => (more && rows[0] ? cursorOf(q, rows[0]) : null);

/** The cursor for the page after `rows` (null when the page was not full: nothing follows). */
const nextAfter = (q: Query, rows: PlanListRow[]) => {
  const last = rows[rows.length - 1];
  return rows.length === q.pageSize && last ? cursorOf(q, last) : null;
};

/** A page as read, answered: without the row read past a previous page's start, with the cursors on either side. */
function withCursors(q: Query, read: PlanListRow[]) {
  const { rows, more } = trimmed(q, read);
  return { rows, nextAfter: nextAfter(q, rows), prevBefore: prevBefore(q, rows, more) };
}

/** One page of plans with the stored latest state: the page is chosen first, names are joined to its rows only. */
export function planPageStatement(q: Query): SQL {
  const { order, pick, sortJoin, after, limit } = pageOrder(q);
  return sql`
    WITH page AS (
      SELECT p.id FROM plans p ${sortJoin}
      WHERE ${filters(q)} AND ${after}
      ORDER BY ${pick} ${limit})
    ${pageColumns(q)} ${pageJoins}
    ORDER BY ${order}`;
}

export const listPlanPage = async (ex: Executor, q: Query) =>
  (await ex.execute<PlanListRow>(planPageStatement(q))).rows;

/** The rows a capped count of the list reads: plans alone, each filter a condition on its row. */
export const countedPlans = (q: Query): SQL => sql`SELECT 1 FROM plans p WHERE ${filters(q)}`;

/** How many plans match, counted up to a cap (see cappedCount). */
export const countPlans = (ex: Executor, q: Query) => cappedCount(ex, countedPlans(q));

/**
 * A page and its capped count. A text search finds its matches once (a materialized CTE) and both the page and the
 * count read them: the trigram look-ups are the costly part, and two statements would run them twice.
 */
export async function listPlansCounted(ex: Executor, q: Query) {
  checkPageRequest(q);
  if (!q.q) {
    const [read, count] = await Promise.all([listPlanPage(ex, q), countPlans(ex, q)]);
    return { ...withCursors(q, read), count };
  }
  const { order, pick, sortJoin, after, limit } = pageOrder(q);
  const res = await ex.execute<PlanListRow & { match_count: number }>(sql`
    WITH matched AS MATERIALIZED (SELECT p.id FROM plans p WHERE ${filters(q)}),
    counted AS (SELECT count(*)::int AS n FROM (SELECT 1 FROM matched LIMIT ${TOTAL_CAP + 1}) capped),
    page AS (
      SELECT p.id FROM matched JOIN plans p ON p.id = matched.id ${sortJoin}
      WHERE ${after}
      ORDER BY ${pick} ${limit})
    ${pageColumns(q)}, counted.n AS match_count ${pageJoins} CROSS JOIN counted
    ORDER BY ${order}`);
  const page = withCursors(
    q,
    res.rows.map(({ match_count: _, ...r }) => r),
  );
  if (res.rows.length > 0) return { ...page, count: cappedTotal(res.rows[0]!.match_count) };
  // An empty first page means nothing matched; an empty later page says nothing of the total, so count apart.
  const first = q.page === 1 && !q.after && !q.before;
  return { ...page, count: first ? cappedTotal(0) : await countPlans(ex, q) };
}

/** The review queue's rows: in review, not this approver's own, not yet decided by them this round. */
const waitingFor = (approverId: number) => sql`
  FROM plan_revisions r
  WHERE r.state = 'in_review' AND r.author_id <> ${approverId}
    AND NOT EXISTS (SELECT 1 FROM plan_decisions d WHERE d.revision_id = r.id AND d.round = r.round AND d.approver_id = ${approverId})`;

export const reviewQueueCount = (ex: Executor, approverId: number) =>
  cappedCount(ex, sql`SELECT 1 ${waitingFor(approverId)}`);

/** One page of the review queue, oldest submission first (partial index plan_revisions_in_review). */
export async function reviewQueue(ex: Executor, approverId: number, page: { limit: number; offset: number }) {
  const res = await ex.execute<{
    plan_id: number;
    title: string;
    number: number;
    author_name: string;
    submitted_at: Date;
    content_hash: string;
    required_approvals: number;
    approvals: number;
  }>(sql`
    WITH queue AS (
      SELECT r.id, r.plan_id, r.number, r.author_id, r.submitted_at, r.content_hash, r.round ${waitingFor(approverId)}
      ORDER BY r.submitted_at ASC, r.id ASC
      LIMIT ${page.limit} OFFSET ${page.offset})
    SELECT p.id AS plan_id, p.title, q.number, a.name AS author_name, q.submitted_at, q.content_hash,
           p.required_approvals,
           (SELECT count(*)::int FROM plan_decisions d WHERE d.revision_id = q.id AND d.round = q.round AND d.decision = 'approve') AS approvals
    FROM queue q JOIN plans p ON p.id = q.plan_id JOIN users a ON a.id = q.author_id
    ORDER BY q.submitted_at ASC, q.id ASC`);
  return res.rows;
}

/** People who own at least one plan, for the list's owner filter (readable by everyone signed in). */
export async function planOwners(ex: Executor) {
  // One probe of the owner index per user, instead of a DISTINCT over every plan.
  const res = await ex.execute<{ id: number; name: string }>(sql`
    SELECT u.id, u.name FROM users u WHERE EXISTS (SELECT 1 FROM plans p WHERE p.owner_id = u.id) ORDER BY u.name`);
  return res.rows;
}
