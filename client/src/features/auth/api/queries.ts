import { sessionQuery } from "./get-session";

/** The auth feature's query factory: `useQuery(authQueries.session())`. */
export const authQueries = {
  session: sessionQuery,
};
