import { queryOptions } from "@tanstack/react-query";
import { budgetRecipesResponseSchema } from "@shared/schemas/budget";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { budgetsKeys } from "./keys";

export const fetchRecipes = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.budgetRecipes(), budgetRecipesResponseSchema, signal);

/** Published starting points; fixed on the server, so read once per session. */
export const recipesQuery = () =>
  queryOptions({ queryKey: budgetsKeys.recipes(), queryFn: ({ signal }) => fetchRecipes(signal), staleTime: Infinity });
