import { z } from "zod";
import { route, type ApiFeature } from "../../http/route";
import { dbIdParam } from "../../../shared/schemas";
import {
  conformanceCheckListSchema,
  conformanceCheckSchema,
  probeResultSchema,
} from "../../../shared/schemas/conformance";
import { listChecks, recordCheck } from "./conformance.service";

const planParams = z.object({ id: dbIdParam });
const revParams = planParams.extend({ n: dbIdParam });

/** Mounted at /api/plans beside the plans routes: probe results recorded as conformance checks on a revision. */
export const conformanceFeature: ApiFeature = {
  prefix: "/plans",
  tag: "plans",
  routes: [
    route({
      method: "post",
      path: "/:id/revisions/:n/conformance-checks",
      summary: "Record a probe result on a revision (bearer token with conformance:write accepted)",
      access: ["researcher", "approver"],
      params: revParams,
      body: probeResultSchema,
      responses: { 201: conformanceCheckSchema },
      handler: async ({ deps, res, user, params, body }) => ({
        status: 201,
        body: await recordCheck(deps, user, params.id, params.n, body, res.locals.viaToken ? "token" : "session"),
      }),
    }),
    route({
      method: "get",
      path: "/:id/conformance-checks",
      summary: "Conformance checks recorded on a plan's revisions, oldest first",
      access: "signed-in",
      params: planParams,
      responses: { 200: conformanceCheckListSchema },
      handler: async ({ deps, params }) => ({ status: 200, body: await listChecks(deps, params.id) }),
    }),
  ],
};
