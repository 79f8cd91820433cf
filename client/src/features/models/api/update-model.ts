import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { ModelProfileValues } from "@shared/schemas/models";
import { modelResponseSchema } from "@shared/schemas/models";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { afterModelSaved } from "@/lib/api/models";

export const updateModel = ({ id, values }: { id: number; values: ModelProfileValues }) =>
  apiClient.send("PUT", apiPaths.model(id), values, modelResponseSchema).then((r) => r.model);

export function useUpdateModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateModel,
    onSuccess: (model) => {
      return afterModelSaved(queryClient, model);
    },
  });
}
