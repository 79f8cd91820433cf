import { queryOptions } from "@tanstack/react-query";
import { verifyResponseSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

export const fetchVerification = (id: number, n: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.revisionVerify(id, n), verifyResponseSchema, signal);

/** Recomputed on the server from the stored content on every read; never cached for long. */
export const verifyQuery = (id: number, n: number) =>
  queryOptions({
    queryKey: plansKeys.verify(id, n),
    queryFn: ({ signal }) => fetchVerification(id, n, signal),
    staleTime: 0,
  });
