import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { reviewQueueResponseSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

/** Rows per page of the queue (the server's default too). */
export const REVIEW_PAGE_SIZE = 50;

export const fetchReviewQueue = (page: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.reviewQueue({ page, pageSize: REVIEW_PAGE_SIZE }), reviewQueueResponseSchema, signal);

/** Revisions waiting for this approver: in review, not theirs, not yet decided by them this round; one page. */
export const reviewQueueQuery = (page = 1) =>
  queryOptions({
    queryKey: plansKeys.reviewQueuePage(page),
    queryFn: ({ signal }) => fetchReviewQueue(page, signal),
    staleTime: 5_000,
    placeholderData: keepPreviousData,
  });
