import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { UpdateRevisionRequest } from "@shared/schemas/plans";
import { draftSavedSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

type Args = { id: number; n: number; changes: UpdateRevisionRequest };

/** Saves a draft with the version read last; a stale version is answered 409 and changes nothing. */
export const updateRevision = ({ id, n, changes }: Args) =>
  apiClient.send("PUT", apiPaths.revision(id, n), changes, draftSavedSchema);

export function useUpdateRevision() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateRevision,
    onSuccess: (_saved, { id }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: plansKeys.detail(id) }),
        queryClient.invalidateQueries({ queryKey: plansKeys.lists() }),
      ]),
  });
}
