import { queryOptions, type QueryClient } from "@tanstack/react-query";
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
export const fetchModels = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.models(), modelsListResponseSchema, signal).then((r) => r.models);

export const fetchModel = (id: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.model(id), modelResponseSchema, signal).then((r) => r.model);

export const modelsQueries = {
  all: () => ["models"] as const,
  lists: () => [...modelsQueries.all(), "list"] as const,
  list: () => queryOptions({ queryKey: modelsQueries.lists(), queryFn: ({ signal }) => fetchModels(signal) }),
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
