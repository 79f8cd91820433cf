import { queryOptions } from "@tanstack/react-query";
import { modelsListResponseSchema } from "../../../../../shared/schemas/model-responses";
import { apiClient } from "../../../lib/api-client";
import { apiPaths } from "../../../config/paths";
import { modelsKeys } from "./keys";

export const fetchModels = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.models(), modelsListResponseSchema, signal).then((r) => r.models);

export const listModelsQuery = () =>
  queryOptions({
    queryKey: modelsKeys.list(),
    queryFn: ({ signal }) => fetchModels(signal),
  });
