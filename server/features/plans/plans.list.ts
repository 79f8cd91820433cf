import { sql, type SQL } from "drizzle-orm";
import type { Executor } from "../../db/client";
import type { planListQuerySchema, RevisionState } from "../../../shared/schemas";
import type { z } from "zod";

type Query = z.output<typeof planListQuerySchema>;

const SORT: Record<Query["sort"], string> = {
  updatedAt: "p.updated_at",
  createdAt: "p.created_at",
  title: "lower(p.title)",
  state: "lr.state",
  owner: "lower(u.name)",
  model: "lower(m.name)",
};

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
  total: number;
};

/** One page of plans, the state being that of the latest revision. Sort columns come from a fixed table, never from input. */
export async function listPlanPage(ex: Executor, q: Query) {
  const where: SQL[] = [sql`true`];
  if (q.state) where.push(sql`lr.state = ${q.state}`);
  if (q.ownerId) where.push(sql`p.owner_id = ${q.ownerId}`);
  if (q.modelId) where.push(sql`p.model_id = ${q.modelId}`);
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(sql`(p.title ILIKE ${like} OR p.purpose ILIKE ${like} OR m.name ILIKE ${like} OR u.name ILIKE ${like})`);
  }
  const order = sql.raw(
    `${SORT[q.sort]} ${q.dir === "asc" ? "ASC" : "DESC"}, p.id ${q.dir === "asc" ? "ASC" : "DESC"}`,
  );
  const res = await ex.execute<PlanListRow>(sql`
    SELECT p.id, p.title, p.purpose, p.owner_id, u.name AS owner_name, p.model_id, m.name AS model_name, p.required_approvals,
           p.created_at, p.updated_at, lr.number AS latest_number, lr.state AS latest_state, ap.number AS approved_number,
           count(*) OVER ()::int AS total
    FROM plans p
    JOIN users u ON u.id = p.owner_id
    JOIN model_profiles m ON m.id = p.model_id
    JOIN LATERAL (SELECT number, state FROM plan_revisions r WHERE r.plan_id = p.id ORDER BY number DESC LIMIT 1) lr ON true
    LEFT JOIN LATERAL (SELECT number FROM plan_revisions r WHERE r.plan_id = p.id AND r.state = 'approved' ORDER BY number DESC LIMIT 1) ap ON true
    WHERE ${sql.join(where, sql` AND `)}
    ORDER BY ${order}
    LIMIT ${q.pageSize} OFFSET ${(q.page - 1) * q.pageSize}`);
  return res.rows;
}

/** Revisions waiting for a decision that this approver has not yet made (and did not author). */
export async function reviewQueue(ex: Executor, approverId: number) {
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
    SELECT p.id AS plan_id, p.title, r.number, a.name AS author_name, r.submitted_at, r.content_hash,
           GREATEST(p.required_approvals, COALESCE((SELECT (value #>> '{}')::int FROM settings WHERE key = 'minRequiredApprovals'), 1)) AS required_approvals,
           (SELECT count(*)::int FROM plan_decisions d WHERE d.revision_id = r.id AND d.round = r.round AND d.decision = 'approve') AS approvals
    FROM plan_revisions r JOIN plans p ON p.id = r.plan_id JOIN users a ON a.id = r.author_id
    WHERE r.state = 'in_review' AND r.author_id <> ${approverId}
      AND NOT EXISTS (SELECT 1 FROM plan_decisions d WHERE d.revision_id = r.id AND d.round = r.round AND d.approver_id = ${approverId})
    ORDER BY r.submitted_at ASC`);
  return res.rows;
}

/** People who own at least one plan, for the list's owner filter (readable by everyone signed in). */
export async function planOwners(ex: Executor) {
  const res = await ex.execute<{ id: number; name: string }>(sql`
    SELECT DISTINCT u.id, u.name FROM plans p JOIN users u ON u.id = p.owner_id ORDER BY u.name`);
  return res.rows;
}
