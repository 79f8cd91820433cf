import { useMutation, useQueryClient, type QueryClient } from "@tanstack/react-query";
import {
  acceleratorResponseSchema,
  acceleratorRetiredResponseSchema,
  type AcceleratorInput,
  type AcceleratorUpdate,
} from "@shared/schemas/budget";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { afterEstimateInputsChanged } from "@/lib/api/budgets";
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

/** After any catalog change: the catalog, and the estimates (they name an accelerator by id; the server reads its figures). */
export const afterCatalogChanged = (queryClient: QueryClient) =>
  Promise.all([
    queryClient.invalidateQueries({ queryKey: acceleratorsKeys.all }),
    afterEstimateInputsChanged(queryClient),
  ]);

function useCatalogMutation<A, R>(fn: (args: A) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => afterCatalogChanged(queryClient) });
}

export const useCreateAccelerator = () => useCatalogMutation(createAccelerator);
export const useUpdateAccelerator = () => useCatalogMutation(updateAccelerator);
export const useDeleteAccelerator = () => useCatalogMutation(deleteAccelerator);
export const useRestoreAccelerator = () => useCatalogMutation(restoreAccelerator);
