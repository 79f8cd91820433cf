import { reviewQueueQuery } from "./review-queue";

/** The review feature's query factory. */
export const reviewQueries = {
  queue: reviewQueueQuery,
};
