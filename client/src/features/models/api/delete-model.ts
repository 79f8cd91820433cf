import { useMutation, useQueryClient } from "@tanstack/react-query";
import { modelResponseSchema, modelRetiredResponseSchema } from "../../../../../shared/schemas/model-responses";
import { apiClient } from "../../../lib/api-client";
import { apiPaths } from "../../../config/paths";
import { modelsKeys } from "./keys";

/** null when gone; the retired profile and the plans that use it when the server retired it instead. */
export const deleteModel = async (id: number) => (await apiClient.sendMaybeContent("DELETE", apiPaths.model(id), modelRetiredResponseSchema)) ?? null;

export const restoreModel = (id: number) => apiClient.send("POST", `${apiPaths.model(id)}/restore`, undefined, modelResponseSchema).then((r) => r.model);

export function useDeleteModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteModel,
    onSuccess: (retired, id) => {
      if (retired) queryClient.setQueryData(modelsKeys.detail(id), retired.model);
      else queryClient.removeQueries({ queryKey: modelsKeys.detail(id) });
      return queryClient.invalidateQueries({ queryKey: modelsKeys.list() });
    },
  });
}

export function useRestoreModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: restoreModel,
    onSuccess: (model) => {
      queryClient.setQueryData(modelsKeys.detail(model.id), model);
      return queryClient.invalidateQueries({ queryKey: modelsKeys.list() });
    },
  });
}
