import { keepPreviousData, queryOptions, skipToken, type QueryClient } from "@tanstack/react-query";
import { budgetEstimateResultSchema, type BudgetEstimateRequest } from "@shared/schemas/budget";
import { apiClient } from "../api-client";
import { apiPaths } from "@/config/paths";

/*
 * POST /api/budgets/estimate stores nothing, so an estimate is read as one query keyed by its body. The body names a
 * model profile and an accelerator by id and the server reads their current figures, so the cache lives here, where
 * the profile and accelerator mutations can reach it: editing either one invalidates every estimate.
 */
export const estimateBudget = (request: BudgetEstimateRequest) =>
  apiClient.send("POST", apiPaths.budgetEstimate(), request, budgetEstimateResultSchema);

export const budgetEstimateQueries = {
  all: () => ["budgets", "estimate"] as const,
  /** Deterministic for given inputs and stored figures: never stale until a profile or accelerator changes. */
  detail: (request: BudgetEstimateRequest | null) =>
    queryOptions({
      queryKey: [...budgetEstimateQueries.all(), request] as const,
      queryFn: request ? () => estimateBudget(request) : skipToken,
      staleTime: Infinity,
      placeholderData: keepPreviousData,
    }),
};

/** After a model profile or an accelerator is saved, retired, restored or deleted. */
export const afterEstimateInputsChanged = (queryClient: QueryClient) =>
  queryClient.invalidateQueries({ queryKey: budgetEstimateQueries.all() });
