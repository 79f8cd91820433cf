import { z } from "zod";
import { route, type ApiFeature } from "./http/route";
import { openApiDocument } from "./openapi";
import { healthFeature } from "./features/health/health.router";
import { authFeature } from "./features/auth/auth.router";
import { usersFeature } from "./features/users";
import { modelsFeature } from "./features/models";
import { analysesFeature } from "./features/analyses/analyses.router";
import { boundsFeature } from "./features/bounds/bounds.router";
import { conformanceFeature, plansFeature, plansUsingModel } from "./features/plans";
import { tokensFeature } from "./features/tokens";
import { auditFeature } from "./features/audit/audit.router";
import { mailFeature } from "./features/mail/mail.router";
import { budgetsFeature } from "./features/budgets";
import { acceleratorsFeature } from "./features/accelerators";
import { signingKeyFeature } from "./features/plans/signing-key.router";
import { exportsFeature } from "./features/exports";
import { evidenceFeature } from "./features/evidence";

/** The document describing every operation, itself included. */
const docsFeature: ApiFeature = {
  prefix: "",
  tag: "system",
  routes: [
    route({
      method: "get",
      path: "/openapi.json",
      summary: "This API as an OpenAPI 3 document",
      access: "public",
      responses: { 200: z.record(z.string(), z.unknown()).describe("OpenAPI 3.0 document") },
      handler: () => ({ status: 200, body: openApiDocument(ALL_FEATURES) as Record<string, unknown> }),
    }),
  ],
};

/** Mounted before sessions and tokens are read: probes, the API document and the signing key need no sign-in. */
export const OPEN_FEATURES: readonly ApiFeature[] = [healthFeature, docsFeature, signingKeyFeature];

/** Mounted after sessions, bearer tokens, CSRF and the JSON body parser. */
export const SESSION_FEATURES: readonly ApiFeature[] = [
  authFeature,
  usersFeature,
  modelsFeature(plansUsingModel),
  analysesFeature,
  boundsFeature,
  plansFeature,
  conformanceFeature,
  evidenceFeature,
  tokensFeature,
  auditFeature,
  mailFeature,
  budgetsFeature,
  acceleratorsFeature,
  exportsFeature,
];

/** Every route the server answers under /api; the OpenAPI document is generated from this list. */
export const ALL_FEATURES: readonly ApiFeature[] = [...OPEN_FEATURES, ...SESSION_FEATURES];
