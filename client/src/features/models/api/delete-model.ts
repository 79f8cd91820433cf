import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiClient } from "../../../lib/api-client";
import { apiPaths } from "../../../config/paths";
import { modelsKeys } from "./keys";

/** 204 when gone; a 409 whose message names the plans that still use the profile. */
export const deleteModel = (id: number) => apiClient.sendNoContent("DELETE", apiPaths.model(id));

export function useDeleteModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteModel,
    onSuccess: (_void, id) => {
      queryClient.removeQueries({ queryKey: modelsKeys.detail(id) });
      return queryClient.invalidateQueries({ queryKey: modelsKeys.list() });
    },
  });
}
