import { keepPreviousData, queryOptions, useQuery, type QueryClient } from "@tanstack/react-query";
import { modelResponseSchema, modelsListResponseSchema } from "@shared/schemas/models";
import type { ModelProfile } from "@shared/schemas/models";
import { apiClient } from "../api-client";
import { apiPaths } from "@/config/paths";
import { analysesQueries } from "./analyses";
import { afterEstimateInputsChanged } from "./budgets";

/*
 * Model profiles are read by the models pages, the workbench, the plan forms and the estimator, so their one
 * fetcher and one cache live here (query-factory style: keys general → specific, each read a `queryOptions`).
 * Features pick the fields they need with `select`, never with a second fetcher or key.
 */
/** GET /api/models answers one page (50 by name unless asked otherwise); `q` searches names. */
export interface ModelListQuery {
  page?: number;
  pageSize?: number;
  q?: string;
  retired?: "include" | "exclude";
}
export const fetchModelPage = (query: ModelListQuery, signal?: AbortSignal) =>
  apiClient.get(apiPaths.models({ ...query }), modelsListResponseSchema, signal);

export const fetchModel = (id: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.model(id), modelResponseSchema, signal).then((r) => r.model);

export const modelsQueries = {
  all: () => ["models"] as const,
  lists: () => [...modelsQueries.all(), "list"] as const,
  list: (query: ModelListQuery = {}) =>
    queryOptions({
      queryKey: [...modelsQueries.lists(), query] as const,
      queryFn: ({ signal }) => fetchModelPage(query, signal),
      // while the next page or search loads, the current one stays on screen
      placeholderData: keepPreviousData,
    }),
  details: () => [...modelsQueries.all(), "detail"] as const,
  detail: (id: number) =>
    queryOptions({
      queryKey: [...modelsQueries.details(), id] as const,
      queryFn: ({ signal }) => fetchModel(id, signal),
    }),
};

/**
 * After a profile is created, edited or imported: its detail is the server's answer, and every list of profiles
 * and every analysis and budget estimate that may have read the profile by id is refetched (both are cached as never
 * stale).
 */
export function afterModelSaved(queryClient: QueryClient, model: ModelProfile) {
  queryClient.setQueryData(modelsQueries.detail(model.id).queryKey, model);
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: modelsQueries.all() }),
    queryClient.invalidateQueries({ queryKey: analysesQueries.all() }),
    afterEstimateInputsChanged(queryClient),
  ]);
}

/** After a profile is deleted: its detail is dropped, the lists and the estimates that named it are refetched. */
export function afterModelDeleted(queryClient: QueryClient, id: number) {
  queryClient.removeQueries({ queryKey: modelsQueries.detail(id).queryKey });
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: modelsQueries.lists() }),
    afterEstimateInputsChanged(queryClient),
  ]);
}

/** How many profiles a picker offers at once; the search box reaches the rest. */
export const PICKER_PAGE = 50;

/**
 * What a profile picker offers: the first PICKER_PAGE profiles in service whose name contains `search`, plus the
 * chosen one (read by id when the page does not hold it, retired or not), so a choice never drops out of its picker
 * while the person searches. `more` says the search matched more than are offered.
 */
export function useModelChoices(search: string, chosenId: number | null | undefined) {
  const page = useQuery(
    modelsQueries.list({ q: search.trim() || undefined, pageSize: PICKER_PAGE, retired: "exclude" }),
  );
  const listed = page.data?.models ?? [];
  const missing = chosenId != null && chosenId > 0 && page.data !== undefined && !listed.some((m) => m.id === chosenId);
  const chosen = useQuery({ ...modelsQueries.detail(chosenId ?? 0), enabled: missing });
  const profiles = missing && chosen.data ? [chosen.data, ...listed] : listed;
  return {
    profiles,
    isPending: page.isPending,
    isError: page.isError,
    error: page.error,
    total: page.data?.total ?? 0,
    more: page.data ? page.data.totalCapped || page.data.total > listed.length : false,
  };
}
