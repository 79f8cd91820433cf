import { route, type ApiFeature } from "../../http/route";
import { noStore } from "../../http/no-store";
import { createdTokenSchema, createTokenRequestSchema, idParamSchema } from "../../../shared/schemas";
import { tokenListResponseSchema } from "../../../shared/schemas/tokens";
import { createToken, listTokens, revokeToken } from "./tokens.service";

/** Mounted at /api/tokens: the signed-in user's own API tokens. */
export const tokensFeature: ApiFeature = {
  prefix: "/tokens",
  tag: "tokens",
  // A created token's secret appears in exactly one answer; nothing may cache it.
  use: [noStore],
  routes: [
    route({
      method: "get",
      path: "/",
      summary: "My API tokens",
      access: "signed-in",
      responses: { 200: tokenListResponseSchema },
      handler: async ({ deps, user }) => ({ status: 200, body: { tokens: await listTokens(deps, user) } }),
    }),
    route({
      method: "post",
      path: "/",
      summary: "Create an API token with scopes, default export:read (secret shown once)",
      access: "signed-in",
      body: createTokenRequestSchema,
      responses: { 201: createdTokenSchema },
      handler: async ({ deps, user, body }) => ({
        status: 201,
        body: await createToken(deps, user, body.name, body.scopes),
      }),
    }),
    route({
      method: "delete",
      path: "/:id",
      summary: "Revoke a token",
      access: "signed-in",
      params: idParamSchema,
      responses: { 204: { contentType: null, description: "Revoked" } },
      handler: async ({ deps, user, params }) => {
        await revokeToken(deps, user, params.id);
        return { status: 204, raw: null };
      },
    }),
  ],
};
