import { queryOptions } from "@tanstack/react-query";
import { planSettingsSchema } from "@shared/schemas/plans";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { plansKeys } from "./keys";

export const fetchPlanSettings = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.planSettings(), planSettingsSchema, signal);

export const planSettingsQuery = () =>
  queryOptions({ queryKey: plansKeys.settings(), queryFn: ({ signal }) => fetchPlanSettings(signal) });
