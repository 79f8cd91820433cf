import { queryOptions } from "@tanstack/react-query";
import { auditChainReportSchema } from "@shared/schemas/audit";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { auditKeys } from "./keys";

/** The server walks the whole hash chain; admins only. Not refetched on focus: it reads every row. */
export const auditChainQuery = () =>
  queryOptions({
    queryKey: auditKeys.chain(),
    queryFn: ({ signal }) => apiClient.get(apiPaths.auditVerify(), auditChainReportSchema, signal),
    refetchOnWindowFocus: false,
  });
