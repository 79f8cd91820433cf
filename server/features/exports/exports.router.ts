import { route, type ApiFeature } from "../../http/route";
import {
  exportRequestSchema,
  exportResponseSchema,
  exportTargetsResponseSchema,
} from "../../../shared/schemas/exports";
import { exportRequest, listTargets } from "./exports.service";

/** Mounted at /api: the export targets and the stateless compile-and-read-back of a plan. */
export const exportsFeature: ApiFeature = {
  prefix: "",
  tag: "export",
  routes: [
    route({
      method: "get",
      path: "/export-targets",
      summary: "The consumers a plan compiles for, with the versions each reader follows",
      access: "signed-in",
      responses: { 200: exportTargetsResponseSchema },
      handler: () => ({ status: 200, body: listTargets() }),
    }),
    route({
      method: "post",
      path: "/exports",
      summary: "Compile a plan for each target and read every artifact back (stateless)",
      access: "signed-in",
      body: exportRequestSchema,
      responses: { 200: exportResponseSchema },
      handler: async ({ deps, body }) => ({ status: 200, body: await exportRequest(deps, body) }),
    }),
  ],
};
