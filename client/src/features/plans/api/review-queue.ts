import { queryOptions } from "@tanstack/react-query";
import { reviewQueueResponseSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

export const fetchReviewQueue = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.reviewQueue(), reviewQueueResponseSchema, signal).then((r) => r.items);

/** Revisions waiting for this approver: in review, not theirs, not yet decided by them this round. */
export const reviewQueueQuery = () =>
  queryOptions({
    queryKey: plansKeys.reviewQueue(),
    queryFn: ({ signal }) => fetchReviewQueue(signal),
    staleTime: 5_000,
  });
