import { useMutation, useQueryClient } from "@tanstack/react-query";
import { importResponseSchema, type ModelProfileInput } from "@shared/schemas/models";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { afterModelSaved } from "@/lib/api/models";

export type ImportRequest = { file: File; save: boolean; overrides?: Partial<ModelProfileInput> };

/**
 * POST /api/models/import (multipart). Without `save` the server only parses and warns; with it the profile is
 * stored together with the file, the user's edits (`overrides`) applied on top of what the file says.
 */
export function importConfig({ file, save, overrides }: ImportRequest) {
  const form = new FormData();
  form.append("file", file, file.name);
  if (overrides && Object.keys(overrides).length) form.append("overrides", JSON.stringify(overrides));
  return apiClient.send("POST", apiPaths.modelImport(save), form, importResponseSchema);
}

export function useImportConfig() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: importConfig,
    onSuccess: (result) => {
      if (!result.saved) return;
      return afterModelSaved(queryClient, result.saved);
    },
  });
}
