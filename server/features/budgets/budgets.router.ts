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
  // 204 when deleted; 200 with the retired accelerator and the plans that use it when it was retired instead.
  r.delete("/:id", keepers, async (req, res) => {
    const out = await acc.deleteAccelerator(deps, currentUser(res), parseParams(idParamSchema, req).id);
    if (out.deleted) res.status(204).end();
    else res.json({ retired: true, accelerator: out.accelerator, usedBy: out.usedBy });
  });
  r.post("/:id/retire", keepers, async (req, res) => {
    res.json({ accelerator: await acc.retireAccelerator(deps, currentUser(res), parseParams(idParamSchema, req).id) });
  });
  r.post("/:id/restore", keepers, async (req, res) => {
    res.json({ accelerator: await acc.restoreAccelerator(deps, currentUser(res), parseParams(idParamSchema, req).id) });
  });
  return r;
}
