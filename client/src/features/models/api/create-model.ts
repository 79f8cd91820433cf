import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { ModelProfileValues } from "@shared/schemas/models";
import { modelResponseSchema } from "@shared/schemas/models";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { afterModelSaved } from "@/lib/api/models";

export const createModel = (body: ModelProfileValues) =>
  apiClient.send("POST", apiPaths.models(), body, modelResponseSchema).then((r) => r.model);

export function useCreateModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createModel,
    onSuccess: (model) => {
      return afterModelSaved(queryClient, model);
    },
  });
}
