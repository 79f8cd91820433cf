import { useMutation, useQueryClient } from "@tanstack/react-query";
import { type UpdateUserRequest, userResponseSchema, type usersListResponseSchema } from "@shared/schemas/users";
import type { z } from "zod";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { usersKeys } from "./keys";

type UsersPage = z.infer<typeof usersListResponseSchema>;

export const updateUser = ({ id, changes }: { id: number; changes: UpdateUserRequest }) =>
  apiClient.send("PATCH", apiPaths.user(id), changes, userResponseSchema).then((r) => r.user);

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: (user) => {
      // Show the change at once, then re-read the list in case the server changed more than this row.
      queryClient.setQueriesData<UsersPage>({ queryKey: usersKeys.list() }, (page) =>
        page ? { ...page, users: page.users.map((u) => (u.id === user.id ? user : u)) } : page,
      );
      return queryClient.invalidateQueries({ queryKey: usersKeys.all });
    },
  });
}
