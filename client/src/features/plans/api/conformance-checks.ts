import { queryOptions, useMutation, useQueryClient } from "@tanstack/react-query";
import { conformanceCheckListSchema, conformanceCheckSchema } from "@shared/schemas/conformance";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

export const fetchConformanceChecks = (id: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.conformanceChecks(id), conformanceCheckListSchema, signal);

/** Probe checks recorded on the plan's revisions (GET /api/plans/:id/conformance-checks). */
export const conformanceChecksQuery = (id: number) =>
  queryOptions({
    queryKey: plansKeys.conformanceChecks(id),
    queryFn: ({ signal }) => fetchConformanceChecks(id, signal),
  });

type UploadArgs = { planId: number; n: number; probe: unknown };

/** Posts the probe's JSON as it was read from the file; the server validates it and names any bad field. */
export const uploadProbe = ({ planId, n, probe }: UploadArgs) =>
  apiClient.send("POST", apiPaths.revisionConformanceChecks(planId, n), probe, conformanceCheckSchema);

export function useUploadProbe() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadProbe,
    onSuccess: (_r, { planId }) => queryClient.invalidateQueries({ queryKey: plansKeys.conformanceChecks(planId) }),
  });
}
