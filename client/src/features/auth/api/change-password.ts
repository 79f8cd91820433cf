import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { ChangePasswordRequest } from "@shared/schemas/auth";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { authKeys } from "./keys";

export const changePassword = (body: ChangePasswordRequest) =>
  apiClient.sendNoContent("POST", apiPaths.password(), body);

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changePassword,
    // The server may rotate the session (and its CSRF token) on a password change; re-read it.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: authKeys.session() }),
  });
}
