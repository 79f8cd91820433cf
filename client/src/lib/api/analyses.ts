import { keepPreviousData, queryOptions, skipToken } from "@tanstack/react-query";
import type { AnalysisRequest } from "@shared/schemas/analysis";
import { analysisColumnsResponseSchema } from "@shared/schemas/analysis-columns";
import { expandAnalysis } from "@shared/analysis-columns";
import { apiClient } from "../api-client";
import { apiPaths } from "@/config/paths";

/**
 * POST /api/analyses stores nothing, so the workbench and the plan pages read it as one query keyed by its body.
 * Asked for in the column form (a third of the bytes; the same numbers) and expanded back into rows here, so the
 * screens read one shape.
 */
export const runAnalysis = (request: AnalysisRequest) =>
  apiClient
    .send("POST", apiPaths.analyses(), { ...request, form: "columns" }, analysisColumnsResponseSchema)
    .then(expandAnalysis);

export const analysesQueries = {
  all: () => ["analyses"] as const,
  /**
   * The same inputs are answered from the cache, and while new inputs compute the previous figures stay on
   * screen. Deterministic for given inputs, so never stale; a profile edit invalidates `all()` (see models.ts).
   */
  detail: (request: AnalysisRequest | null) =>
    queryOptions({
      queryKey: [...analysesQueries.all(), request] as const,
      // No valid request yet: nothing to ask.
      queryFn: request ? () => runAnalysis(request) : skipToken,
      staleTime: Infinity,
      placeholderData: keepPreviousData,
    }),
};
