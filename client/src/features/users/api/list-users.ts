import { queryOptions } from "@tanstack/react-query";
import { usersListResponseSchema } from "@shared/schemas/users";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { usersKeys } from "./keys";

export const fetchUsers = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.users(), usersListResponseSchema, signal).then((r) => r.users);

export const listUsersQuery = () =>
  queryOptions({
    queryKey: usersKeys.list(),
    queryFn: ({ signal }) => fetchUsers(signal),
  });
