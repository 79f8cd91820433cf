import type { RevisionState } from "./schemas/plans";

/*
 * Sign-off rules of a plan, read by the server (plans, export, review queue) and by the plan pages. Product rules of
 * Ropewalk (common practice for a sign-off workflow, no outside source): a revision is signed once approved and stays
 * signed when a later one supersedes it; the plan's signed revision is its latest approved one.
 */

/** States whose content carries approvers' signatures: approved, and approved then superseded by a later sign-off. */
export const SIGNED_STATES: readonly RevisionState[] = ["approved", "superseded"];
export const isSigned = (state: RevisionState) => SIGNED_STATES.includes(state);

/** The highest-numbered revision in state `approved` (at most one is, since approving supersedes the previous one). */
export function latestApproved<R extends { number: number; state: RevisionState }>(revisions: readonly R[]) {
  let found: R | undefined;
  for (const r of revisions) if (r.state === "approved" && (!found || r.number > found.number)) found = r;
  return found;
}

/** Approvals a revision needs: what the plan asks, raised to the lab-wide minimum when that is higher. */
export const effectiveRequiredApprovals = (planRequired: number, labMinimum: number) =>
  Math.max(planRequired, labMinimum);
