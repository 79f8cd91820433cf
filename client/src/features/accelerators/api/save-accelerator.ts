import { useMutation, useQueryClient } from "@tanstack/react-query";
import {
  acceleratorResponseSchema,
  acceleratorRetiredResponseSchema,
  type AcceleratorInput,
  type AcceleratorUpdate,
} from "@shared/schemas/budget";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { acceleratorsKeys } from "./keys";

export const createAccelerator = (body: AcceleratorInput) =>
  apiClient.send("POST", apiPaths.accelerators(), body, acceleratorResponseSchema).then((r) => r.accelerator);

export const updateAccelerator = ({ id, changes }: { id: number; changes: AcceleratorUpdate }) =>
  apiClient.send("PUT", apiPaths.accelerator(id), changes, acceleratorResponseSchema).then((r) => r.accelerator);

/** null when deleted; the retired accelerator and the plans that use it when the server retired it instead. */
export async function deleteAccelerator(id: number) {
  const res = await apiClient.sendMaybeContent("DELETE", apiPaths.accelerator(id), acceleratorRetiredResponseSchema);
  return res ?? null;
}

export const restoreAccelerator = (id: number) =>
  apiClient
    .send("POST", apiPaths.acceleratorRestore(id), undefined, acceleratorResponseSchema)
    .then((r) => r.accelerator);

function useCatalogMutation<A, R>(fn: (args: A) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: acceleratorsKeys.all }),
  });
}

export const useCreateAccelerator = () => useCatalogMutation(createAccelerator);
export const useUpdateAccelerator = () => useCatalogMutation(updateAccelerator);
export const useDeleteAccelerator = () => useCatalogMutation(deleteAccelerator);
export const useRestoreAccelerator = () => useCatalogMutation(restoreAccelerator);
