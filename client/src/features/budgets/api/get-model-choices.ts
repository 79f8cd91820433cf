import { queryOptions } from "@tanstack/react-query";
import { z } from "zod";
import { modelProfileSchema } from "../../../../../shared/schemas/models";
import { apiClient } from "../../../lib/api-client";
import { apiPaths } from "../../../config/paths";
import { budgetsKeys } from "./keys";

/** Only the fields the estimator uses; the rest of each profile is dropped. */
export const modelChoiceSchema = modelProfileSchema.pick({
  id: true, name: true, family: true, parameters: true, layers: true, attentionHeads: true, kvHeads: true,
  headDim: true, hiddenSize: true, bytesPerElement: true, trainedContext: true, retiredAt: true,
});
export type ModelChoice = z.infer<typeof modelChoiceSchema>;
const responseSchema = z.object({ models: z.array(modelChoiceSchema) });

export const fetchModelChoices = (signal?: AbortSignal) =>
  apiClient.get(apiPaths.budgetModelChoices(), responseSchema, signal).then((r) => r.models);

export const modelChoicesQuery = () =>
  queryOptions({ queryKey: budgetsKeys.models(), queryFn: ({ signal }) => fetchModelChoices(signal) });
