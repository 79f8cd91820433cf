import { useQuery } from "@tanstack/react-query";
import type { BudgetEstimateRequest } from "@shared/schemas/budget";
import { useDebounced } from "@/lib/use-debounced";
import { budgetEstimateQueries } from "@/lib/api/budgets";

/** How long inputs must rest before the server is asked again. */
export const ESTIMATE_DEBOUNCE_MS = 300;

/**
 * The estimate for `request`, re-asked once the inputs rest; the last figures stay on screen
 * (marked stale by `isPlaceholderData`) while the next ones are computed. `null` asks nothing.
 * The cache is lib/api/budgets.ts's, so a profile or accelerator edit refreshes it.
 */
export function useBudgetEstimate(request: BudgetEstimateRequest | null) {
  const settled = useDebounced(request, ESTIMATE_DEBOUNCE_MS);
  const query = useQuery(budgetEstimateQueries.detail(settled));
  // Inputs typed but not yet sent count as pending too, so the figures are never shown as current when they are not.
  const settling = JSON.stringify(settled) !== JSON.stringify(request);
  // Returned beside the query, not spread into it, so only the fields a component reads re-render it.
  return { query, settling };
}
