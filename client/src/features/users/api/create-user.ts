import { useMutation, useQueryClient } from "@tanstack/react-query";
import { type CreateUserRequest, userResponseSchema } from "@shared/schemas/users";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { usersKeys } from "./keys";

export const createUser = (body: CreateUserRequest) =>
  apiClient.send("POST", apiPaths.users(), body, userResponseSchema).then((r) => r.user);

export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersKeys.all }),
  });
}
