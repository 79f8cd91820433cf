import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { analysisResponseSchema, type AnalysisRequest } from "../../../../../shared/schemas/analysis";
import { apiClient } from "../../../lib/api-client";
import { apiPaths } from "../../../config/paths";
import { plansKeys } from "./keys";

// POST /api/analyses stores nothing, so it is read like a query keyed by its body.
export const runAnalysis = (request: AnalysisRequest) =>
  apiClient.send("POST", apiPaths.planAnalysis(), request, analysisResponseSchema);

export const analysisQuery = (request: AnalysisRequest | null) =>
  queryOptions({
    queryKey: plansKeys.analysis(request ?? { model: { modelId: 0 }, targetContext: 0, methods: [] }),
    queryFn: () => runAnalysis(request!),
    enabled: request !== null,
    staleTime: Infinity,
    placeholderData: keepPreviousData,
  });
