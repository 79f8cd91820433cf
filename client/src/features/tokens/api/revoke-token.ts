import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { tokensKeys } from "./keys";

export const revokeToken = (id: number) => apiClient.sendNoContent("DELETE", apiPaths.token(id));

export function useRevokeToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeToken,
    onSettled: () => queryClient.invalidateQueries({ queryKey: tokensKeys.all }),
  });
}
