import { queryOptions } from "@tanstack/react-query";
import { z } from "zod";
import { modelProfileSchema } from "../../../../../shared/schemas/models";
import { apiClient } from "../../../lib/api-client";
import { apiPaths } from "../../../config/paths";
import { plansKeys } from "./keys";

const modelsResponseSchema = z.object({ models: z.array(modelProfileSchema) });

/** Model profiles a plan may be drafted for (GET /api/models). */
export const fetchModelChoices = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.planModelChoices(), modelsResponseSchema, signal).then((r) => r.models);

export const modelChoicesQuery = () =>
  queryOptions({ queryKey: plansKeys.modelChoices(), queryFn: ({ signal }) => fetchModelChoices(signal), staleTime: 60_000 });
