import { z } from "zod";
import { pagedTotal, pageQuerySchema, roleSchema } from "./common";
import { PASSWORD_MIN } from "./auth";

export const userSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  roles: z.array(roleSchema),
  active: z.boolean(),
  createdAt: z.string(),
});
export type User = z.infer<typeof userSchema>;

/** GET /api/users: one page in id order (50 by default); `q` keeps users whose name or e-mail contains it. */
export const usersListQuerySchema = pageQuerySchema(50).extend({ q: z.string().trim().max(254).optional() });
export type UsersListQuery = z.infer<typeof usersListQuerySchema>;

export const usersListResponseSchema = z.object({
  users: z.array(userSchema),
  ...pagedTotal,
  page: z.number(),
  pageSize: z.number(),
});
/** POST /api/users and PATCH /api/users/:id: the user as stored. */
export const userResponseSchema = z.object({ user: userSchema });

const rolesField = z
  .array(roleSchema)
  .min(1, "pick at least one role")
  .max(5)
  .refine((r) => new Set(r).size === r.length, "roles must not repeat");

export const createUserRequestSchema = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  name: z.string().trim().min(1).max(120),
  password: z.string().min(PASSWORD_MIN, `at least ${PASSWORD_MIN} characters`).max(200),
  roles: rolesField,
});
export type CreateUserRequest = z.infer<typeof createUserRequestSchema>;

/** PATCH /api/users/:id — any subset. */
export const updateUserRequestSchema = z
  .object({
    name: z.string().trim().min(1).max(120).optional(),
    roles: rolesField.optional(),
    active: z.boolean().optional(),
  })
  .refine((v) => Object.keys(v).length > 0, "nothing to change");
export type UpdateUserRequest = z.infer<typeof updateUserRequestSchema>;
