import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { fetchSession, replaceSession } from "./get-session";

/** Logout ends the session; a fresh GET gives the anonymous session and its new CSRF token. */
export async function logout() {
  await apiClient.sendNoContent("POST", apiPaths.logout());
  return fetchSession();
}

export function useLogout() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onSuccess: (session) => replaceSession(queryClient, session),
  });
}
