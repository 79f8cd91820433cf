import { queryOptions } from "@tanstack/react-query";
import { planOwnersResponseSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

/** Everyone who owns a plan (GET /api/plans/owners), sorted by name on the server. */
export const fetchPlanOwners = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.planOwners(), planOwnersResponseSchema, signal).then((r) => r.owners);

export const planOwnersQuery = () =>
  queryOptions({ queryKey: plansKeys.owners(), queryFn: ({ signal }) => fetchPlanOwners(signal), staleTime: 60_000 });
