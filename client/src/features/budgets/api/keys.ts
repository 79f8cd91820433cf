/** Query keys for the budgets feature, general to specific (estimates are cached in lib/api/budgets.ts). */
export const budgetsKeys = {
  all: ["budgets"] as const,
  recipes: () => [...budgetsKeys.all, "recipes"] as const,
  currency: () => [...budgetsKeys.all, "currency"] as const,
};
