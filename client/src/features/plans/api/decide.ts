import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { z } from "zod";
import type { decisionRequestSchema } from "@shared/schemas/plans";
import { transitionResponseSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

type Args = { planId: number; n: number; body: z.input<typeof decisionRequestSchema> };

/** An approver's decision; the server signs the revision's content hash as it stands in the locked row. */
export const decide = ({ planId, n, body }: Args) =>
  apiClient.send("POST", apiPaths.revisionDecisions(planId, n), body, transitionResponseSchema);

export function useDecide() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: decide,
    onSettled: () => queryClient.invalidateQueries({ queryKey: plansKeys.reviewQueue() }),
  });
}
