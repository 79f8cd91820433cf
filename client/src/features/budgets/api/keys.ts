import type { BudgetEstimateRequest } from "@shared/schemas/budget";

/** Query keys for the budgets feature, general to specific. */
export const budgetsKeys = {
  all: ["budgets"] as const,
  recipes: () => [...budgetsKeys.all, "recipes"] as const,
  estimate: (request: BudgetEstimateRequest | null) => [...budgetsKeys.all, "estimate", request] as const,
};
