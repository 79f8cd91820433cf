import { queryOptions } from "@tanstack/react-query";
import { diffResponseSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

export const fetchDiff = (id: number, a: number, b: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.revisionDiff(id, a, b), diffResponseSchema, signal);

export const diffQuery = (id: number, a: number, b: number) =>
  queryOptions({ queryKey: plansKeys.diff(id, a, b), queryFn: ({ signal }) => fetchDiff(id, a, b, signal) });
