import { useMutation, useQueryClient } from "@tanstack/react-query";
import { newRevisionResponseSchema, transitionResponseSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

type Rev = { id: number; n: number };

export const submitRevision = ({ id, n }: Rev) =>
  apiClient.send("POST", apiPaths.revisionSubmit(id, n), {}, transitionResponseSchema);
export const withdrawRevision = ({ id, n }: Rev) =>
  apiClient.send("POST", apiPaths.revisionWithdraw(id, n), {}, transitionResponseSchema);
export const startRevision = ({ id }: { id: number }) =>
  apiClient.send("POST", apiPaths.planRevisions(id), {}, newRevisionResponseSchema);

/** Re-reads one plan (its revisions, verify results and diffs) and every list; for changes made elsewhere, e.g. a decision. */
export function useRefreshPlan() {
  const queryClient = useQueryClient();
  return (id: number) =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: plansKeys.detail(id) }),
      queryClient.invalidateQueries({ queryKey: plansKeys.lists() }),
    ]);
}

function usePlanMutation<A extends { id: number }, R>(fn: (args: A) => Promise<R>) {
  const refresh = useRefreshPlan();
  return useMutation({ mutationFn: fn, onSettled: (_r, _e, args) => refresh(args.id) });
}

/** draft → in review (the author). */
export const useSubmitRevision = () => usePlanMutation(submitRevision);
/** in review → draft (the author). */
export const useWithdrawRevision = () => usePlanMutation(withdrawRevision);
/** A new draft from the latest revision (the owner). */
export const useStartRevision = () => usePlanMutation(startRevision);
