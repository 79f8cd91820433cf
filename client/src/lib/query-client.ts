import { MutationCache, QueryCache, QueryClient } from "@tanstack/react-query";
import { isApiError } from "./api-client";

/** 4xx answers will not change on retry; network blips and 5xx get two more tries. */
function shouldRetry(failureCount: number, error: unknown) {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

/**
 * `onSignedOut` runs when any request reports the session has ended (code "unauthorized"),
 * so the app can refresh who is signed in and send the user to sign-in.
 * A wrong password at sign-in has its own code and does not trigger it.
 */
export function createQueryClient(onSignedOut: () => void) {
  const onError = (error: unknown) => {
    if (isApiError(error) && error.status === 401 && error.code === "unauthorized") onSignedOut();
  };
  return new QueryClient({
    queryCache: new QueryCache({ onError }),
    mutationCache: new MutationCache({ onError }),
    defaultOptions: {
      queries: { retry: shouldRetry, staleTime: 30_000, refetchOnWindowFocus: false },
      mutations: { retry: false },
    },
  });
}
