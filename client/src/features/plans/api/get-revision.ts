import { queryOptions } from "@tanstack/react-query";
import { revisionResponseSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

export const fetchRevision = (id: number, n: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.revision(id, n), revisionResponseSchema, signal);

export const revisionQuery = (id: number, n: number) =>
  queryOptions({ queryKey: plansKeys.revision(id, n), queryFn: ({ signal }) => fetchRevision(id, n, signal) });
