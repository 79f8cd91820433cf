import { queryOptions, type QueryClient } from "@tanstack/react-query";
import { sessionResponseSchema, type SessionResponse } from "@shared/schemas/auth";
import { apiClient, setCsrfToken } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { authKeys } from "./keys";

export async function fetchSession(signal?: AbortSignal): Promise<SessionResponse> {
  const session = await apiClient.get(apiPaths.session(), sessionResponseSchema, signal);
  setCsrfToken(session.csrfToken);
  return session;
}

export const sessionQuery = () =>
  queryOptions({
    queryKey: authKeys.session(),
    queryFn: ({ signal }) => fetchSession(signal),
    staleTime: 5 * 60_000,
  });

/**
 * Records who is signed in after login or logout. Data cached for the previous user is dropped
 * so nothing of theirs shows to the next one; the session entry itself is kept so screens
 * watching it update in place.
 */
export function replaceSession(queryClient: QueryClient, session: SessionResponse) {
  setCsrfToken(session.csrfToken);
  queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
  queryClient.setQueryData(authKeys.session(), session);
}
