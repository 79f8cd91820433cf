import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { CreatePlanRequest } from "@shared/schemas/plans";
import { planDetailSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

export const createPlan = (body: CreatePlanRequest) => apiClient.send("POST", apiPaths.plans(), body, planDetailSchema);

export function useCreatePlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createPlan,
    onSuccess: (plan) => {
      queryClient.setQueryData(plansKeys.detail(plan.id), plan);
      // A first plan makes its author an owner the list can filter by.
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: plansKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: plansKeys.owners() }),
      ]);
    },
  });
}
