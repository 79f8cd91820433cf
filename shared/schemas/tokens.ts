import { z } from "zod";

/**
 * What an API token may do: a closed list, so a token can never hold a scope the server does not know.
 * `export:read` is today's read-only export token: plan reads and plan exports, nothing else (no users, audit
 * or mail, even when the owner is an admin). Later features add members here (e.g. `evidence:write`) together with
 * the routes each one grants in server/http/token-scopes.ts.
 */
export const TOKEN_SCOPES = ["export:read", "conformance:write", "evidence:write"] as const;
export const tokenScopeSchema = z.enum(TOKEN_SCOPES);
export type TokenScope = z.infer<typeof tokenScopeSchema>;
export const DEFAULT_TOKEN_SCOPES: TokenScope[] = ["export:read"];

/** Plain-language line per scope for the token page. */
export const TOKEN_SCOPE_LABELS: Record<TokenScope, string> = {
  "export:read": "Read plans and fetch approved exports",
  "conformance:write": "Post probe results as conformance checks on plan revisions",
  "evidence:write": "Upload evaluation results to approved plan revisions",
};

export const createTokenRequestSchema = z.strictObject({
  name: z.string().trim().min(1).max(80),
  scopes: z
    .array(tokenScopeSchema)
    .min(1, "pick at least one scope")
    .max(TOKEN_SCOPES.length)
    .refine((s) => new Set(s).size === s.length, "each scope once")
    .default(DEFAULT_TOKEN_SCOPES),
});
export const apiTokenSchema = z.object({
  id: z.number(),
  name: z.string(),
  prefix: z.string(),
  scopes: z.array(tokenScopeSchema),
  createdAt: z.string(),
  lastUsedAt: z.string().nullable(),
  revokedAt: z.string().nullable(),
});
export type ApiToken = z.infer<typeof apiTokenSchema>;
export const createdTokenSchema = apiTokenSchema.extend({ token: z.string() });

/** GET /api/tokens (server/features/tokens/tokens.router.ts). */
export const tokenListResponseSchema = z.object({ tokens: z.array(apiTokenSchema) });
