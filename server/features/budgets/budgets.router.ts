import { route, type ApiFeature } from "../../http/route";
import {
  budgetEstimateRequestSchema,
  budgetEstimateResultSchema,
  budgetRecipesResponseSchema,
} from "../../../shared/schemas/budget";
import { listRecipes, resolveAndEstimate } from "./budgets.service";

/** Mounted at /api/budgets: stateless estimates and the published recipes. */
export const budgetsFeature: ApiFeature = {
  prefix: "/budgets",
  tag: "budgets",
  routes: [
    route({
      method: "post",
      path: "/estimate",
      summary: "Tokens, FLOPs, hours, cost and memory per stage",
      access: "signed-in",
      body: budgetEstimateRequestSchema,
      responses: { 200: budgetEstimateResultSchema },
      handler: async ({ deps, body }) => ({ status: 200, body: await resolveAndEstimate(deps.db, body) }),
    }),
    route({
      method: "get",
      path: "/recipes",
      summary: "Published starting points",
      access: "signed-in",
      responses: { 200: budgetRecipesResponseSchema },
      handler: () => ({ status: 200, body: listRecipes() }),
    }),
  ],
};
