import { queryOptions, useMutation, useQueryClient } from "@tanstack/react-query";
import { workspaceCurrencySchema } from "@shared/schemas/budget";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { budgetsKeys } from "./keys";

export const fetchCurrency = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.budgetCurrency(), workspaceCurrencySchema, signal);

/** The workspace currency every price and cost is in. */
export const currencyQuery = () =>
  queryOptions({ queryKey: budgetsKeys.currency(), queryFn: ({ signal }) => fetchCurrency(signal) });

export const saveCurrency = (currency: string) =>
  apiClient.send("PUT", apiPaths.budgetCurrency(), { currency }, workspaceCurrencySchema);

/** Admin only; every estimate carries the currency, so they are all asked again. */
export function useSaveCurrency() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveCurrency,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: budgetsKeys.all }),
  });
}
