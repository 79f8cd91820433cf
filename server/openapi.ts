import { OpenAPIRegistry, OpenApiGeneratorV3 } from "@asteasolutions/zod-to-openapi";
import { z } from "zod";
import * as s from "../shared/schemas";
import { acceleratorInputSchema, acceleratorUpdateSchema, budgetEstimateRequestSchema, budgetEstimateSchema } from "../shared/schemas/budget";
import { baseBoundRequestSchema, baseBoundResponseSchema } from "../shared/schemas/bounds";
import { signingKeyResponseSchema, verifyResponseSchema } from "../shared/schemas/plan-responses";

type Method = "get" | "post" | "put" | "patch" | "delete";
interface Route { method: Method; path: string; summary: string; tag: string; body?: z.ZodType; query?: z.ZodObject; response?: z.ZodType; status?: number }

const id = z.object({ id: z.string() });
const rev = z.object({ id: z.string(), n: z.string() });

/** Every API route, with its request and response contracts from shared/ (the same schemas the server validates with). */
export const ROUTES: Route[] = [
  { method: "get", path: "/api/health", summary: "Liveness and database state", tag: "system" },
  { method: "get", path: "/api/auth/session", summary: "Current user and CSRF token", tag: "auth", response: s.sessionResponseSchema },
  { method: "post", path: "/api/auth/login", summary: "Sign in", tag: "auth", body: s.loginRequestSchema },
  { method: "post", path: "/api/auth/logout", summary: "Sign out", tag: "auth", status: 204 },
  { method: "post", path: "/api/auth/password", summary: "Change own password", tag: "auth", body: s.changePasswordRequestSchema, status: 204 },
  { method: "get", path: "/api/users", summary: "List users (admin)", tag: "users", response: s.usersListResponseSchema },
  { method: "post", path: "/api/users", summary: "Create a user (admin)", tag: "users", body: s.createUserRequestSchema, status: 201 },
  { method: "patch", path: "/api/users/{id}", summary: "Change a user's name, roles or activity (admin)", tag: "users", body: s.updateUserRequestSchema },
  { method: "get", path: "/api/models", summary: "List model profiles", tag: "models" },
  { method: "post", path: "/api/models", summary: "Create a model profile", tag: "models", body: s.modelProfileInputSchema, status: 201 },
  { method: "post", path: "/api/models/import", summary: "Parse (and optionally save) a config.json upload (multipart field 'file')", tag: "models", response: s.importResponseSchema },
  { method: "get", path: "/api/models/{id}", summary: "One model profile", tag: "models" },
  { method: "put", path: "/api/models/{id}", summary: "Replace a model profile", tag: "models", body: s.modelProfileInputSchema },
  { method: "delete", path: "/api/models/{id}", summary: "Delete a profile no plan uses (204); one that plans use is retired instead (200)", tag: "models", status: 204 },
  { method: "post", path: "/api/models/{id}/retire", summary: "Hide a profile from pickers; plans on it keep working", tag: "models" },
  { method: "post", path: "/api/models/{id}/restore", summary: "Offer a retired profile again", tag: "models" },
  { method: "get", path: "/api/models/{id}/source", summary: "The uploaded config.json", tag: "models" },
  { method: "post", path: "/api/analyses", summary: "Compare scaling methods pair by pair (stateless)", tag: "engine", body: s.analysisRequestSchema, response: s.analysisResponseSchema },
  { method: "post", path: "/api/bounds/base", summary: "Supported length of a base, or smallest supporting base (worker thread)", tag: "engine", body: baseBoundRequestSchema, response: baseBoundResponseSchema },
  { method: "post", path: "/api/bounds/base/stream", summary: "Same search as server-sent events with progress", tag: "engine", body: baseBoundRequestSchema },
  { method: "get", path: "/api/plans", summary: "Plans, paged, sorted and filtered", tag: "plans", query: s.planListQuerySchema },
  { method: "post", path: "/api/plans", summary: "Create a plan with revision 1 as a draft", tag: "plans", body: s.createPlanRequestSchema, status: 201 },
  { method: "get", path: "/api/plans/settings", summary: "Lab-wide plan settings", tag: "plans" },
  { method: "put", path: "/api/plans/settings", summary: "Set the lab-wide minimum of approvals (admin)", tag: "plans", body: s.planSettingsSchema },
  { method: "get", path: "/api/plans/owners", summary: "People who own plans (for filters)", tag: "plans" },
  { method: "get", path: "/api/plans/review-queue", summary: "Revisions awaiting my decision (approver)", tag: "plans" },
  { method: "get", path: "/api/plans/{id}", summary: "A plan with its revisions and decisions", tag: "plans" },
  { method: "get", path: "/api/plans/{id}/approved/export", summary: "Configuration patch of the latest approved revision (bearer token accepted)", tag: "export" },
  { method: "post", path: "/api/plans/{id}/revisions", summary: "New draft from the latest revision", tag: "plans", status: 201 },
  { method: "get", path: "/api/plans/{id}/revisions/{n}", summary: "One revision with its content", tag: "plans" },
  { method: "put", path: "/api/plans/{id}/revisions/{n}", summary: "Edit a draft (optimistic version)", tag: "plans", body: s.updateRevisionRequestSchema },
  { method: "post", path: "/api/plans/{id}/revisions/{n}/submit", summary: "Submit a draft for review", tag: "workflow" },
  { method: "post", path: "/api/plans/{id}/revisions/{n}/withdraw", summary: "Withdraw a revision from review", tag: "workflow" },
  { method: "post", path: "/api/plans/{id}/revisions/{n}/decisions", summary: "Approve or request changes (approver)", tag: "workflow", body: s.decisionRequestSchema },
  { method: "get", path: "/api/plans/{id}/revisions/{n}/verify", summary: "Recompute the content hash; check each decision's signed hash and signature", tag: "export", response: verifyResponseSchema },
  { method: "get", path: "/api/signing-key", summary: "Public Ed25519 key (PEM) and key id that check decision signatures (no sign-in)", tag: "export", response: signingKeyResponseSchema },
  { method: "get", path: "/api/plans/{id}/revisions/{n}/export", summary: "Configuration patch of a signed revision", tag: "export" },
  { method: "get", path: "/api/plans/{id}/revisions/{a}/diff/{b}", summary: "Differences between two revisions", tag: "plans" },
  { method: "get", path: "/api/plans/{id}/revisions/{n}/report", summary: "Printable HTML report", tag: "export" },
  { method: "get", path: "/api/tokens", summary: "My API tokens", tag: "tokens" },
  { method: "post", path: "/api/tokens", summary: "Create an API token with scopes, default export:read (secret shown once)", tag: "tokens", body: s.createTokenRequestSchema, status: 201 },
  { method: "delete", path: "/api/tokens/{id}", summary: "Revoke a token", tag: "tokens", status: 204 },
  { method: "get", path: "/api/audit", summary: "Audit trail (admin, approver)", tag: "audit", query: s.auditQuerySchema },
  { method: "get", path: "/api/audit/verify", summary: "Check the audit hash chain; names the first broken link (admin)", tag: "audit", response: s.auditChainReportSchema },
  { method: "get", path: "/api/mail", summary: "Local mail sink and outbox (admin)", tag: "mail" },
  { method: "post", path: "/api/mail/deliver", summary: "Deliver due mail now (admin)", tag: "mail" },
  { method: "post", path: "/api/budgets/estimate", summary: "Tokens, FLOPs, hours, cost and memory per stage", tag: "budgets", body: budgetEstimateRequestSchema, response: budgetEstimateSchema },
  { method: "get", path: "/api/budgets/recipes", summary: "Published starting points", tag: "budgets" },
  { method: "get", path: "/api/accelerators", summary: "Accelerator catalog", tag: "budgets" },
  { method: "post", path: "/api/accelerators", summary: "Add an accelerator type (infra, admin)", tag: "budgets", body: acceleratorInputSchema, status: 201 },
  { method: "put", path: "/api/accelerators/{id}", summary: "Change an accelerator type (infra, admin)", tag: "budgets", body: acceleratorUpdateSchema },
  { method: "delete", path: "/api/accelerators/{id}", summary: "Remove an accelerator type no plan was costed on (204); one that plans use is retired instead (200) (infra, admin)", tag: "budgets", status: 204 },
  { method: "post", path: "/api/accelerators/{id}/retire", summary: "Hide an accelerator from pickers; budgets on it keep their figures (infra, admin)", tag: "budgets" },
  { method: "post", path: "/api/accelerators/{id}/restore", summary: "Offer a retired accelerator again (infra, admin)", tag: "budgets" },
];

const errorResponse = { description: "Error: { error: { code, message, fields? } }", content: { "application/json": { schema: s.apiErrorSchema } } };

function register(registry: OpenAPIRegistry, r: Route, withSchemas: boolean) {
  const params = r.path.includes("{a}") ? z.object({ id: z.string(), a: z.string(), b: z.string() }) : r.path.includes("{n}") ? rev : r.path.includes("{id}") ? id : undefined;
  const ok = r.status ?? 200;
  registry.registerPath({
    method: r.method, path: r.path, summary: r.summary, tags: [r.tag],
    request: {
      ...(params ? { params } : {}),
      ...(withSchemas && r.query ? { query: r.query } : {}),
      ...(withSchemas && r.body ? { body: { content: { "application/json": { schema: r.body } } } } : {}),
    },
    responses: {
      [ok]: { description: "Success", ...(withSchemas && r.response ? { content: { "application/json": { schema: r.response } } } : {}) },
      400: errorResponse, 401: errorResponse, 403: errorResponse, 404: errorResponse, 409: errorResponse,
    },
  });
}

let cached: object | undefined;
/** OpenAPI 3 document; a route whose schema the generator cannot express keeps its path with a plain description. */
export function openApiDocument() {
  if (cached) return cached;
  const registry = new OpenAPIRegistry();
  registry.registerComponent("securitySchemes", "bearer", { type: "http", scheme: "bearer", description: "Personal read-only API token" });
  for (const r of ROUTES) {
    const probe = new OpenAPIRegistry();
    register(probe, r, true);
    let expressible = true;
    try {
      new OpenApiGeneratorV3(probe.definitions).generateDocument({ openapi: "3.0.3", info: { title: "probe", version: "0" } });
    } catch {
      expressible = false;
    }
    register(registry, r, expressible);
  }
  cached = new OpenApiGeneratorV3(registry.definitions).generateDocument({
    openapi: "3.0.3",
    info: { title: "Ropewalk API", version: "1.0.0", description: "Rotary scaling plans: analyses, budgets, revisions and sign-off. Figures are estimates; a plan is confirmed only by long-context evaluations of the tuned model." },
  });
  return cached;
}
