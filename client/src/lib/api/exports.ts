import { queryOptions, skipToken } from "@tanstack/react-query";
import { exportResponseSchema, type ExportRequest } from "@shared/schemas/exports";
import { apiClient } from "../api-client";
import { apiPaths } from "@/config/paths";

/** POST /api/exports compiles the plan for every target and stores nothing: read as a query keyed by its body. */
export const runExports = (request: ExportRequest) =>
  apiClient.send("POST", apiPaths.exports(), request, exportResponseSchema);

export const exportsQueries = {
  all: () => ["exports"] as const,
  /** Deterministic for given inputs, so never stale (the workbench, the plan page and the decision dialog share it). */
  detail: (request: ExportRequest | null) =>
    queryOptions({
      queryKey: [...exportsQueries.all(), request] as const,
      queryFn: request ? () => runExports(request) : skipToken,
      staleTime: Infinity,
    }),
};
