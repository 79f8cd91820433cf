import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import type { z } from "zod";
import type { planListQuerySchema } from "@shared/schemas/plans";
import { planListResponseSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

/** What the list asks the server for; anything left out takes the server's default. */
export type PlanListParams = Partial<z.output<typeof planListQuerySchema>>;

export const fetchPlans = (query: PlanListParams, signal?: AbortSignal) =>
  apiClient.get(apiPaths.plans(query), planListResponseSchema, signal);

/** One server-sorted, server-filtered page; the previous page stays on screen while the next loads. */
export const listPlansQuery = (query: PlanListParams) =>
  queryOptions({
    queryKey: plansKeys.list(query),
    queryFn: ({ signal }) => fetchPlans(query, signal),
    placeholderData: keepPreviousData,
  });
