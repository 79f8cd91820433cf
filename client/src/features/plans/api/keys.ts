import type { PlanListParams } from "./list-plans";

/** Query keys for plans, general to specific: invalidating `detail(id)` refreshes its revisions, verify and diffs too. */
export const plansKeys = {
  all: ["plans"] as const,
  lists: () => [...plansKeys.all, "list"] as const,
  list: (query: PlanListParams) => [...plansKeys.lists(), query] as const,
  details: () => [...plansKeys.all, "detail"] as const,
  detail: (id: number) => [...plansKeys.details(), id] as const,
  revision: (id: number, n: number) => [...plansKeys.detail(id), "revision", n] as const,
  verify: (id: number, n: number) => [...plansKeys.detail(id), "verify", n] as const,
  diff: (id: number, a: number, b: number) => [...plansKeys.detail(id), "diff", a, b] as const,
  conformanceChecks: (id: number) => [...plansKeys.detail(id), "conformance-checks"] as const,
  settings: () => [...plansKeys.all, "settings"] as const,
  owners: () => [...plansKeys.all, "owners"] as const,
  /** Under `all`, so a plan change that invalidates every plan read refreshes the approver's queue too. */
  reviewQueue: () => [...plansKeys.all, "review-queue"] as const,
  reviewQueuePage: (page: number) => [...plansKeys.reviewQueue(), page] as const,
};
