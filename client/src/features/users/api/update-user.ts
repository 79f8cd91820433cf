import { useMutation, useQueryClient } from "@tanstack/react-query";
import { type UpdateUserRequest, type User, userResponseSchema } from "@shared/schemas/users";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { usersKeys } from "./keys";

export const updateUser = ({ id, changes }: { id: number; changes: UpdateUserRequest }) =>
  apiClient.send("PATCH", apiPaths.user(id), changes, userResponseSchema).then((r) => r.user);

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: (user) => {
      // Show the change at once, then re-read the list in case the server changed more than this row.
      queryClient.setQueryData<User[]>(usersKeys.list(), (list) => list?.map((u) => (u.id === user.id ? user : u)));
      return queryClient.invalidateQueries({ queryKey: usersKeys.all });
    },
  });
}
