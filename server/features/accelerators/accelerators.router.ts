import { route, type ApiFeature } from "../../http/route";
import { idParamSchema } from "../../../shared/schemas";
import {
  acceleratorInputSchema,
  acceleratorListResponseSchema,
  acceleratorResponseSchema,
  acceleratorRetiredResponseSchema,
  acceleratorUpdateSchema,
} from "../../../shared/schemas/budget";
import * as acc from "./accelerators.service";

const keepers = ["infra", "admin"] as const;

/** Mounted at /api/accelerators: the catalog everyone reads and infra/admin keep. */
export const acceleratorsFeature: ApiFeature = {
  prefix: "/accelerators",
  tag: "accelerators",
  routes: [
    route({
      method: "get",
      path: "/",
      summary: "Accelerator catalog",
      access: "signed-in",
      responses: { 200: acceleratorListResponseSchema },
      handler: async ({ deps }) => ({ status: 200, body: { accelerators: await acc.listAccelerators(deps) } }),
    }),
    route({
      method: "post",
      path: "/",
      summary: "Add an accelerator type (infra, admin)",
      access: keepers,
      body: acceleratorInputSchema,
      responses: { 201: acceleratorResponseSchema },
      handler: async ({ deps, user, body }) => ({
        status: 201,
        body: { accelerator: await acc.createAccelerator(deps, user, body) },
      }),
    }),
    route({
      method: "put",
      path: "/:id",
      summary: "Change an accelerator type (infra, admin)",
      access: keepers,
      params: idParamSchema,
      body: acceleratorUpdateSchema,
      responses: { 200: acceleratorResponseSchema },
      handler: async ({ deps, user, params, body }) => ({
        status: 200,
        body: { accelerator: await acc.updateAccelerator(deps, user, params.id, body) },
      }),
    }),
    route({
      method: "delete",
      path: "/:id",
      access: keepers,
      params: idParamSchema,
      summary:
        "Remove an accelerator type no plan was costed on (204); one that plans use is retired instead (200) (infra, admin)",
      responses: {
        204: { contentType: null, description: "Removed" },
        200: acceleratorRetiredResponseSchema.describe("Retired instead, with the plans that use it"),
      },
      handler: async ({ deps, user, params }) => {
        const out = await acc.deleteAccelerator(deps, user, params.id);
        if (out.deleted) return { status: 204, raw: null };
        return { status: 200, body: { retired: true as const, accelerator: out.accelerator, usedBy: out.usedBy } };
      },
    }),
    route({
      method: "post",
      path: "/:id/retire",
      summary: "Hide an accelerator from pickers; budgets on it keep their figures (infra, admin)",
      access: keepers,
      params: idParamSchema,
      responses: { 200: acceleratorResponseSchema },
      handler: async ({ deps, user, params }) => ({
        status: 200,
        body: { accelerator: await acc.retireAccelerator(deps, user, params.id) },
      }),
    }),
    route({
      method: "post",
      path: "/:id/restore",
      summary: "Offer a retired accelerator again (infra, admin)",
      access: keepers,
      params: idParamSchema,
      responses: { 200: acceleratorResponseSchema },
      handler: async ({ deps, user, params }) => ({
        status: 200,
        body: { accelerator: await acc.restoreAccelerator(deps, user, params.id) },
      }),
    }),
  ],
};
