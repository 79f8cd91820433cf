import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { budgetEstimateResultSchema, type BudgetEstimateRequest } from "@shared/schemas/budget";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { useDebounced } from "@/lib/use-debounced";
import { budgetsKeys } from "./keys";

export const estimateBudget = (request: BudgetEstimateRequest) =>
  apiClient.send("POST", apiPaths.budgetEstimate(), request, budgetEstimateResultSchema);

/** How long inputs must rest before the server is asked again. */
export const ESTIMATE_DEBOUNCE_MS = 300;

/**
 * The estimate for `request`, re-asked once the inputs rest; the last figures stay on screen
 * (marked stale by `isPlaceholderData`) while the next ones are computed. `null` asks nothing.
 */
export function useBudgetEstimate(request: BudgetEstimateRequest | null) {
  const settled = useDebounced(request, ESTIMATE_DEBOUNCE_MS);
  const query = useQuery({
    queryKey: budgetsKeys.estimate(settled),
    queryFn: () => estimateBudget(settled as BudgetEstimateRequest),
    enabled: settled !== null,
    placeholderData: keepPreviousData,
    staleTime: Infinity,
  });
  // Inputs typed but not yet sent count as pending too, so the figures are never shown as current when they are not.
  const settling = JSON.stringify(settled) !== JSON.stringify(request);
  // Returned beside the query, not spread into it, so only the fields a component reads re-render it.
  return { query, settling };
}
