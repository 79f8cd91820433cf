import { useQuery, useQueryClient } from "@tanstack/react-query";
import type { SessionUser } from "@shared/schemas/auth";
import { authQueries } from "../api/queries";
import { authKeys } from "../api/keys";

export const useSession = () => useQuery(authQueries.session());

/** For screens inside the signed-in layout, which only renders once a user is known. */
export function useCurrentUser(): SessionUser {
  const { data } = useSession();
  if (!data?.user) throw new Error("useCurrentUser used outside the signed-in layout");
  return data.user;
}

/** Re-read who is signed in, e.g. after an admin changed their own roles. */
export function useRefreshSession() {
  const queryClient = useQueryClient();
  return () => queryClient.invalidateQueries({ queryKey: authKeys.session() });
}
