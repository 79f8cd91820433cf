import type { AppDeps } from "../../deps";
import type { DiffResponse, ReviewQueueItem } from "../../../shared/schemas/plans";
import { diffContents } from "./diff";
import { planOwners, reviewQueue, reviewQueueCount } from "./plans.list";
import { minRequiredApprovals } from "./plans.repo";
import { getRevision } from "./plans.service";
import { pageWindow } from "../../platform/paging";
import { effectiveRequiredApprovals } from "../../../shared/plan-rules";

/** Lab-wide plan settings as everyone may read them. */
export const planSettings = async (deps: AppDeps) => ({ minRequiredApprovals: await minRequiredApprovals(deps.db) });

/** People who own plans (for the list's filter). */
export const listPlanOwners = async (deps: AppDeps) => ({ owners: await planOwners(deps.db) });

/** Revisions awaiting this approver's decision, oldest submission first, one page. */
export async function listReviewQueue(deps: AppDeps, approverId: number, q: { page: number; pageSize: number }) {
  const [rows, count, labMinimum] = await Promise.all([
    reviewQueue(deps.db, approverId, pageWindow(q.page, q.pageSize)),
    reviewQueueCount(deps.db, approverId),
    minRequiredApprovals(deps.db),
  ]);
  const items: ReviewQueueItem[] = rows.map((q) => ({
    planId: q.plan_id,
    title: q.title,
    revision: q.number,
    author: q.author_name,
    submittedAt: new Date(q.submitted_at).toISOString(),
    contentHash: q.content_hash,
    approvals: q.approvals,
    requiredApprovals: effectiveRequiredApprovals(q.required_approvals, labMinimum),
  }));
  return { ...count, page: q.page, pageSize: q.pageSize, items };
}

/** Field, stage, flag and budget differences between revisions a and b of one plan. */
export async function diffRevisions(deps: AppDeps, planId: number, a: number, b: number): Promise<DiffResponse> {
  const [ra, rb] = await Promise.all([getRevision(deps, planId, a), getRevision(deps, planId, b)]);
  return {
    a: { number: a, contentHash: ra.contentHash },
    b: { number: b, contentHash: rb.contentHash },
    ...diffContents(ra.content, rb.content),
  };
}
