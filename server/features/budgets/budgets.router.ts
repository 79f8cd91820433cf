import { Router } from "express";
import type { AppDeps } from "../../deps";
import { currentUser, requireAuth, requireRole } from "../../http/auth";
import { parseBody, parseParams } from "../../http/validate";
import { BUDGET_RECIPES, RECIPE_CAUTION } from "../../engine/budget";
import { idParamSchema } from "../../../shared/schemas";
import { acceleratorInputSchema, acceleratorUpdateSchema, budgetEstimateRequestSchema } from "../../../shared/schemas/budget";
import * as acc from "./accelerators.service";
import { resolveAndEstimate } from "./budgets.service";

export function budgetsRouter(deps: AppDeps) {
  const r = Router();
  r.use(requireAuth);
  r.post("/estimate", async (req, res) => {
    res.json(await resolveAndEstimate(deps.db, parseBody(budgetEstimateRequestSchema, req)));
  });
  r.get("/recipes", (_req, res) => {
    res.json({ recipes: BUDGET_RECIPES, caution: RECIPE_CAUTION });
  });
  return r;
}

export function acceleratorsRouter(deps: AppDeps) {
  const r = Router();
  const keepers = requireRole("infra", "admin");
  r.use(requireAuth);
  r.get("/", async (_req, res) => {
    res.json({ accelerators: await acc.listAccelerators(deps) });
  });
  r.post("/", keepers, async (req, res) => {
    res.status(201).json({ accelerator: await acc.createAccelerator(deps, currentUser(res), parseBody(acceleratorInputSchema, req)) });
  });
  r.put("/:id", keepers, async (req, res) => {
    const { id } = parseParams(idParamSchema, req);
    res.json({ accelerator: await acc.updateAccelerator(deps, currentUser(res), id, parseBody(acceleratorUpdateSchema, req)) });
  });
  r.delete("/:id", keepers, async (req, res) => {
    await acc.deleteAccelerator(deps, currentUser(res), parseParams(idParamSchema, req).id);
    res.status(204).end();
  });
  return r;
}
