import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import type { z } from "zod";
import type { auditQuerySchema } from "@shared/schemas/audit";
import { auditPageSchema } from "@shared/schemas/audit";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { auditKeys } from "./keys";

export type AuditParams = Partial<z.output<typeof auditQuerySchema>>;

export const fetchAuditPage = (params: AuditParams, signal?: AbortSignal) =>
  apiClient.get(apiPaths.audit(params), auditPageSchema, signal);

/** One page of the trail, newest first, filtered on the server. */
export const auditPageQuery = (params: AuditParams) =>
  queryOptions({
    queryKey: auditKeys.page(params),
    queryFn: ({ signal }) => fetchAuditPage(params, signal),
    placeholderData: keepPreviousData,
  });
