import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { z } from "zod";
import { createdTokenSchema, type createTokenRequestSchema } from "@shared/schemas/tokens";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { tokensKeys } from "./keys";

/** The answer carries the secret; the server keeps only its hash, so this is the one time it can be shown. */
export const createToken = (body: z.input<typeof createTokenRequestSchema>) =>
  apiClient.send("POST", apiPaths.tokens(), body, createdTokenSchema);

export function useCreateToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createToken,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokensKeys.all }),
  });
}
