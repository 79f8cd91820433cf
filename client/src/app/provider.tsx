import { useState, type ReactNode } from "react";
import { QueryClientProvider } from "@tanstack/react-query";
import { createQueryClient } from "../lib/query-client";
import { authKeys } from "../features/auth/api/keys";

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(() => {
    // When any request says the session ended, re-read it; the signed-in layout then redirects to sign-in.
    const client = createQueryClient(() => void client.invalidateQueries({ queryKey: authKeys.session() }));
    return client;
  });
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
