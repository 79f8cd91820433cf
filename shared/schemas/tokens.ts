import { z } from "zod";

export const createTokenRequestSchema = z.strictObject({ name: z.string().trim().min(1).max(80) });
export const apiTokenSchema = z.object({
  id: z.number(), name: z.string(), prefix: z.string(), createdAt: z.string(), lastUsedAt: z.string().nullable(), revokedAt: z.string().nullable(),
});
export type ApiToken = z.infer<typeof apiTokenSchema>;
export const createdTokenSchema = apiTokenSchema.extend({ token: z.string() });
