import { OpenAPIRegistry, OpenApiGeneratorV3, type RouteConfig } from "@asteasolutions/zod-to-openapi";
import { z } from "zod";
import { apiErrorSchema } from "../shared/schemas";
import { isRaw, type ApiFeature, type ApiRoute } from "./http/route";

/** "/plans" + "/:id/revisions/:n" → "/api/plans/{id}/revisions/{n}" (OpenAPI path template). */
export const openApiPath = (prefix: string, path: string) =>
  `/api${prefix}${path === "/" ? "" : path}`.replace(/:([A-Za-z_]\w*)/g, "{$1}") || "/api";

const errorResponse = {
  description: "Error: { error: { code, message, fields? } }",
  content: { "application/json": { schema: apiErrorSchema } },
};

/** Whether the generator can write this schema; some (transforms over unknown input) it cannot. */
function expressible(schema: z.ZodType): boolean {
  const probe = new OpenAPIRegistry();
  probe.registerPath({
    method: "post",
    path: "/probe",
    responses: { 200: { description: "probe", content: { "application/json": { schema } } } },
  });
  try {
    new OpenApiGeneratorV3(probe.definitions).generateDocument({
      openapi: "3.0.3",
      info: { title: "probe", version: "0" },
    });
    return true;
  } catch {
    return false;
  }
}
const orDescribed = (schema: z.ZodType) =>
  expressible(schema) ? schema : z.unknown().describe("see the shared zod schema; not expressible in OpenAPI 3.0");
const asObject = (schema: z.ZodType | undefined) =>
  schema instanceof z.ZodObject && expressible(schema) ? schema : undefined;

function operation(feature: ApiFeature, r: ApiRoute): RouteConfig {
  const responses: RouteConfig["responses"] = {};
  for (const [status, spec] of Object.entries(r.responses)) {
    if (isRaw(spec))
      responses[status] = {
        description: spec.description,
        ...(spec.contentType ? { content: { [spec.contentType]: { schema: z.string() } } } : {}),
      };
    else
      responses[status] = {
        description: spec.description ?? "Success",
        content: { "application/json": { schema: orDescribed(spec) } },
      };
  }
  const errors = [400, 401, 403, 404, 409].filter((s) => !(s in responses));
  const params = asObject(r.params);
  const query = asObject(r.query);
  const who =
    r.access === "public"
      ? "anyone"
      : r.access === "signed-in"
        ? "any signed-in user"
        : `roles: ${r.access.join(", ")}`;
  return {
    method: r.method,
    path: openApiPath(feature.prefix, r.path),
    summary: r.summary,
    tags: [feature.tag],
    description: `Who: ${who}.`,
    request: {
      ...(params ? { params: params as z.ZodObject } : {}),
      ...(query ? { query: query as z.ZodObject } : {}),
      ...(r.body ? { body: { content: { "application/json": { schema: orDescribed(r.body) } } } } : {}),
      ...(r.form ? { body: { content: { [r.form.contentType]: { schema: r.form.schema } } } } : {}),
    },
    responses: { ...responses, ...Object.fromEntries(errors.map((s) => [s, errorResponse])) },
  };
}

const cache = new WeakMap<readonly ApiFeature[], object>();
/** OpenAPI 3 document generated from the same route definitions the server mounts. */
export function openApiDocument(features: readonly ApiFeature[]) {
  const hit = cache.get(features);
  if (hit) return hit;
  const registry = new OpenAPIRegistry();
  registry.registerComponent("securitySchemes", "bearer", {
    type: "http",
    scheme: "bearer",
    description: "Personal API token (scoped, read-only)",
  });
  for (const f of features) for (const r of f.routes) registry.registerPath(operation(f, r));
  const doc = new OpenApiGeneratorV3(registry.definitions).generateDocument({
    openapi: "3.0.3",
    info: {
      title: "Ropewalk API",
      version: "1.0.0",
      description:
        "Rotary scaling plans: analyses, budgets, revisions and sign-off. Figures are estimates; a plan is confirmed only by long-context evaluations of the tuned model.",
    },
  });
  cache.set(features, doc);
  return doc;
}

/** Every operation as (method, OpenAPI path, query object): what tests walk to probe each documented route. */
export const documentedRoutes = (features: readonly ApiFeature[]) =>
  features.flatMap((f) =>
    f.routes.map((r) => ({
      method: r.method,
      path: openApiPath(f.prefix, r.path),
      query: r.query instanceof z.ZodObject ? r.query : undefined,
    })),
  );
