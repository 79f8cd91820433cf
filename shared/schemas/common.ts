import { z } from "zod";

/** Every error the API returns has this shape. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof apiErrorSchema>;

export const ROLES = ["admin", "researcher", "infra", "approver", "viewer"] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

export const idParamSchema = z.object({ id: z.coerce.number().int().positive() });
