import { keepPreviousData, queryOptions } from "@tanstack/react-query";
import { usersListResponseSchema } from "@shared/schemas/users";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { usersKeys } from "./keys";

/** GET /api/users answers one page in id order; `q` searches names and e-mails. */
export interface UserListQuery {
  page?: number;
  pageSize?: number;
  q?: string;
}

export const fetchUsers = (query: UserListQuery, signal?: AbortSignal) =>
  apiClient.get(apiPaths.users({ ...query }), usersListResponseSchema, signal);

export const listUsersQuery = (query: UserListQuery = {}) =>
  queryOptions({
    queryKey: [...usersKeys.list(), query] as const,
    queryFn: ({ signal }) => fetchUsers(query, signal),
    placeholderData: keepPreviousData,
  });
