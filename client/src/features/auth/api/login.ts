import { useMutation, useQueryClient } from "@tanstack/react-query";
import { sessionResponseSchema, sessionUserSchema, type LoginRequest } from "@shared/schemas/auth";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { replaceSession } from "./get-session";

const loginResponseSchema = sessionResponseSchema.extend({ user: sessionUserSchema });

/** The server regenerates the session on login, so the token in the answer replaces the old one. */
export const login = (body: LoginRequest) => apiClient.send("POST", apiPaths.login(), body, loginResponseSchema);

export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (session) => replaceSession(queryClient, session),
  });
}
