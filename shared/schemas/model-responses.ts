import { z } from "zod";
import { modelProfileSchema } from "./models";

/** Bodies of the model-profile routes (server/features/models/models.router.ts). */
export const modelsListResponseSchema = z.object({ models: z.array(modelProfileSchema) });
export const modelResponseSchema = z.object({ model: modelProfileSchema });
export type ModelsListResponse = z.infer<typeof modelsListResponseSchema>;
/** DELETE /api/models/:id on a profile plans use: retired instead, with those plans. */
export const modelRetiredResponseSchema = z.object({
  retired: z.literal(true),
  model: modelProfileSchema,
  usedBy: z.array(z.object({ id: z.number().int(), title: z.string() })),
});
