import { queryOptions } from "@tanstack/react-query";
import { acceleratorListResponseSchema } from "@shared/schemas/budget";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";
import { acceleratorsKeys } from "./keys";

export const fetchAccelerators = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.accelerators(), acceleratorListResponseSchema, signal).then((r) => r.accelerators);

/** The catalog, sorted by name on the server. */
export const acceleratorsQuery = () =>
  queryOptions({ queryKey: acceleratorsKeys.list(), queryFn: ({ signal }) => fetchAccelerators(signal) });
