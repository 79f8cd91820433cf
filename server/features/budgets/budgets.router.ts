import { route, type ApiFeature } from "../../http/route";
import {
  budgetEstimateRequestSchema,
  budgetEstimateResultSchema,
  budgetRecipesResponseSchema,
  workspaceCurrencySchema,
} from "../../../shared/schemas/budget";
import { listRecipes, resolveAndEstimate } from "./budgets.service";
import { setWorkspaceCurrency, workspaceCurrency } from "./currency.service";

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
    route({
      method: "get",
      path: "/currency",
      summary: "The workspace currency of every price and cost",
      access: "signed-in",
      responses: { 200: workspaceCurrencySchema },
      handler: async ({ deps }) => ({ status: 200, body: { currency: await workspaceCurrency(deps.db) } }),
    }),
    route({
      method: "put",
      path: "/currency",
      summary: "Change the workspace currency (admin; audited)",
      access: ["admin"],
      body: workspaceCurrencySchema,
      responses: { 200: workspaceCurrencySchema },
      handler: async ({ deps, user, body }) => ({
        status: 200,
        body: await setWorkspaceCurrency(deps, user, body.currency),
      }),
    }),
  ],
};
