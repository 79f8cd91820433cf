import { BUDGET_RECIPES, estimateBudget, RECIPE_CAUTION } from "../../engine/budget";
import type { Executor } from "../../db/client";
import { Invalid } from "../../platform/errors";
import { findModelRow } from "../models";
import { findAccelerator } from "../accelerators";
import type { ParsedBudgetEstimateRequest } from "../../../shared/schemas/budget";
import { budgetShapeOf } from "../../../shared/profile-shapes";

/** Replaces { modelId } and { acceleratorId } with the stored numbers, then runs the budget engine. */
export async function resolveAndEstimate(ex: Executor, req: ParsedBudgetEstimateRequest) {
  let model;
  if ("modelId" in req.model && req.model.modelId !== undefined) {
    const m = await findModelRow(ex, req.model.modelId);
    if (!m) throw new Invalid("no such model profile", { "model.modelId": "not found" });
    model = budgetShapeOf(m);
  } else model = req.model as Exclude<typeof req.model, { modelId: number }>;
  let cluster;
  let acceleratorName: string | null = null;
  if ("acceleratorId" in req.cluster && req.cluster.acceleratorId !== undefined) {
    const a = await findAccelerator(ex, req.cluster.acceleratorId);
    if (!a) throw new Invalid("no such accelerator", { "cluster.acceleratorId": "not found" });
    cluster = { peakFlops: a.peakFlops, memoryBytes: a.memoryBytes, pricePerHour: a.pricePerHour };
    acceleratorName = a.name;
  } else cluster = req.cluster as Exclude<typeof req.cluster, { acceleratorId: number }>;
  const estimate = estimateBudget({ ...req, model, cluster });
  return { ...estimate, resolved: { model, cluster, acceleratorName } };
}

/** The published starting points with the caution that goes with them. */
export const listRecipes = () => ({ recipes: [...BUDGET_RECIPES], caution: RECIPE_CAUTION });
