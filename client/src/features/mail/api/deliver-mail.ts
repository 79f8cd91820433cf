import { useMutation, useQueryClient } from "@tanstack/react-query";
import { deliveryResultSchema } from "@shared/schemas/mail";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { mailKeys } from "./keys";

/** Sends what is due now instead of waiting for the worker. */
export const deliverMail = () => apiClient.send("POST", apiPaths.mailDeliver(), {}, deliveryResultSchema);

export function useDeliverMail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deliverMail,
    onSettled: () => queryClient.invalidateQueries({ queryKey: mailKeys.all }),
  });
}
