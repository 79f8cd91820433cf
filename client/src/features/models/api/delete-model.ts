import { useMutation, useQueryClient } from "@tanstack/react-query";
import { modelResponseSchema, modelRetiredResponseSchema } from "@shared/schemas/models";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { afterModelDeleted, afterModelSaved } from "@/lib/api/models";

/** null when gone; the retired profile and the plans that use it when the server retired it instead. */
export const deleteModel = async (id: number) =>
  (await apiClient.sendMaybeContent("DELETE", apiPaths.model(id), modelRetiredResponseSchema)) ?? null;

export const restoreModel = (id: number) =>
  apiClient.send("POST", apiPaths.modelRestore(id), undefined, modelResponseSchema).then((r) => r.model);

export function useDeleteModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteModel,
    onSuccess: (retired, id) =>
      retired ? afterModelSaved(queryClient, retired.model) : afterModelDeleted(queryClient, id),
  });
}

export function useRestoreModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: restoreModel,
    onSuccess: (model) => afterModelSaved(queryClient, model),
  });
}
