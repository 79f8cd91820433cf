import { keepPreviousData, queryOptions, skipToken } from "@tanstack/react-query";
import { analysisResponseSchema, type AnalysisRequest } from "../../../../../shared/schemas/analysis";
import { apiClient } from "../../../lib/api-client";
import { apiPaths } from "../../../config/paths";
import { workbenchKeys } from "./keys";

export const runAnalysis = (request: AnalysisRequest) => apiClient.send("POST", apiPaths.analyses(), request, analysisResponseSchema);

/**
 * POST /api/analyses keyed by the request itself: the same inputs are answered from the cache, and while new
 * inputs compute the previous figures stay on screen. Deterministic, so never stale.
 */
export const analysisQuery = (request: AnalysisRequest | null) =>
  queryOptions({
    queryKey: workbenchKeys.analysis(request),
    // No valid request yet: nothing to ask.
    queryFn: request ? () => runAnalysis(request) : skipToken,
    staleTime: Infinity,
    placeholderData: keepPreviousData,
  });
