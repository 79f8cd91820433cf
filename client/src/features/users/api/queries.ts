import { listUsersQuery } from "./list-users";

/** The users feature's query factory: `useQuery(usersQueries.list())`. */
export const usersQueries = {
  list: listUsersQuery,
};
