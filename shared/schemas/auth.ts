import { z } from "zod";
import { roleSchema } from "./common";

export const loginRequestSchema = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  password: z.string().min(1).max(200),
});
export type LoginRequest = z.infer<typeof loginRequestSchema>;

export const sessionUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  roles: z.array(roleSchema),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;

export const sessionResponseSchema = z.object({
  user: sessionUserSchema.nullable(),
  csrfToken: z.string(),
});
export type SessionResponse = z.infer<typeof sessionResponseSchema>;
/** POST /api/auth/login: the signed-in user and the session's CSRF token. */
export const loginResponseSchema = z.object({ user: sessionUserSchema, csrfToken: z.string() });
export type LoginResponse = z.infer<typeof loginResponseSchema>;

export const PASSWORD_MIN = 10;
export const changePasswordRequestSchema = z.object({
  currentPassword: z.string().min(1).max(200),
  newPassword: z.string().min(PASSWORD_MIN, `at least ${PASSWORD_MIN} characters`).max(200),
});
export type ChangePasswordRequest = z.infer<typeof changePasswordRequestSchema>;
