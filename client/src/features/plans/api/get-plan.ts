import { queryOptions } from "@tanstack/react-query";
import { planDetailSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

export const fetchPlan = (id: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.plan(id), planDetailSchema, signal);

export const planQuery = (id: number) =>
  queryOptions({ queryKey: plansKeys.detail(id), queryFn: ({ signal }) => fetchPlan(id, signal) });
