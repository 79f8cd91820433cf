import { queryOptions } from "@tanstack/react-query";
import { modelResponseSchema } from "../../../../../shared/schemas/model-responses";
import { apiClient } from "../../../lib/api-client";
import { apiPaths } from "../../../config/paths";
import { modelsKeys } from "./keys";

export const fetchModel = (id: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.model(id), modelResponseSchema, signal).then((r) => r.model);

export const getModelQuery = (id: number) =>
  queryOptions({
    queryKey: modelsKeys.detail(id),
    queryFn: ({ signal }) => fetchModel(id, signal),
  });
