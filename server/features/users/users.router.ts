import { route, type ApiFeature } from "../../http/route";
import {
  createUserRequestSchema,
  idParamSchema,
  updateUserRequestSchema,
  userResponseSchema,
  usersListQuerySchema,
  usersListResponseSchema,
} from "../../../shared/schemas";
import { createUser, listUsers, updateUser } from "./users.service";

/** Mounted at /api/users; admins only. */
export const usersFeature: ApiFeature = {
  prefix: "/users",
  tag: "users",
  routes: [
    route({
      method: "get",
      path: "/",
      summary: "List users, one page in id order (?page, ?pageSize, ?q name or e-mail search) (admin)",
      access: ["admin"],
      query: usersListQuerySchema,
      responses: { 200: usersListResponseSchema },
      handler: async ({ deps, query }) => ({ status: 200, body: await listUsers(deps, query) }),
    }),
    route({
      method: "post",
      path: "/",
      summary: "Create a user (admin)",
      access: ["admin"],
      body: createUserRequestSchema,
      responses: { 201: userResponseSchema },
      handler: async ({ deps, user, body }) => ({ status: 201, body: { user: await createUser(deps, user, body) } }),
    }),
    route({
      method: "patch",
      path: "/:id",
      summary: "Change a user's name, roles or activity (admin)",
      access: ["admin"],
      params: idParamSchema,
      body: updateUserRequestSchema,
      responses: { 200: userResponseSchema },
      handler: async ({ deps, user, params, body }) => ({
        status: 200,
        body: { user: await updateUser(deps, user, params.id, body) },
      }),
    }),
  ],
};
