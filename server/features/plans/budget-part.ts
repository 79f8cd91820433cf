import type { Executor } from "../../db/client";
import { profileExtras, resolveAndEstimate } from "../budgets";
import { findModelRow } from "../models";
import { budgetShapeOf } from "../../../shared/profile-shapes";
import { planBudgetContexts } from "../../../shared/plan-budget";
import { Conflict, Invalid } from "../../platform/errors";
import { findAccelerator } from "../accelerators";
import { parseOr400 } from "../../platform/validate";
import {
  BUDGET_MODEL_VERSION,
  budgetEstimateRequestSchema,
  type RevisionBudgetV2,
} from "../../../shared/schemas/budget";
import type { RevisionValues } from "../../../shared/schemas";
import type { ModelSnapshot } from "./revision-content";

export type BudgetPart = RevisionBudgetV2;

/**
 * The budget figures of a revision: the plan's stages on the chosen cluster, with the catalog's numbers and the
 * workspace currency copied in, so a later price or currency change never alters a submitted revision. The part
 * carries its budget model version: revisions frozen under an older model are shown as they were signed.
 */
export async function budgetPart(
  ex: Executor,
  model: ModelSnapshot,
  v: RevisionValues,
): Promise<BudgetPart | undefined> {
  if (!v.budget) return undefined;
  const budgetModel = BUDGET_MODEL_VERSION;
  if (!v.stages.length) return { budgetModel, inputs: v.budget, skipped: "the plan has no stages to cost" };
  const { vocabSize, ...settings } = v.budget;
  // The profile's vocabulary, layer groups and latent cache width; a vocabulary typed on the sheet wins.
  const row = await findModelRow(ex, model.id);
  const extras = row ? profileExtras(row) : {};
  const request = {
    ...settings,
    model: { ...budgetShapeOf(model), ...extras, ...(vocabSize ? { vocabSize } : {}) },
    ...planBudgetContexts(
      model.trainedContext,
      v.targetContext,
      v.stages.map((s) => s.sequenceLength),
    ),
    stages: v.stages.map((s) => ({ sequenceLength: s.sequenceLength, steps: s.steps, globalBatch: s.globalBatch })),
  };
  let out;
  try {
    out = await resolveAndEstimate(ex, parseOr400(budgetEstimateRequestSchema, request, "budget"));
  } catch (e) {
    // Name the plan's fields: budget.cluster.acceleratorId, budget.contextParallel, stages.N.…
    if (e instanceof Invalid) {
      const fields = Object.fromEntries(
        Object.entries(e.fields ?? {}).map(([k, m]) => [
          k.startsWith("stages.") ? k : k === "model.vocabSize" ? "budget.vocabSize" : `budget.${k}`,
          m,
        ]),
      );
      throw new Invalid(`the budget sheet is not valid: ${Object.keys(fields).join(", ")}`, fields);
    }
    throw e;
  }
  const { resolved, currency, ...estimate } = out;
  return {
    budgetModel,
    inputs: v.budget,
    cluster: { name: resolved.acceleratorName, ...resolved.cluster },
    currency,
    estimate,
  };
}

const catalogId = (inputs: RevisionValues["budget"] | undefined) => {
  const c = inputs?.cluster as { acceleratorId?: number } | undefined;
  return c?.acceleratorId;
};

/**
 * A retired accelerator is refused as a new choice (400 naming the field) and at submission (409), but a draft that
 * already names one still saves, so its author can edit anything while deciding which accelerator to pick instead.
 * `kept` is the accelerator the draft carried before this change.
 */
export async function refuseRetiredAccelerator(
  ex: Executor,
  inputs: RevisionValues["budget"] | undefined,
  when: "choose" | "submit",
  kept?: number,
) {
  const id = catalogId(inputs);
  if (id === undefined || (when === "choose" && id === kept)) return;
  const a = await findAccelerator(ex, id);
  if (!a?.retiredAt) return;
  const fields = { "budget.cluster.acceleratorId": `${a.name} is retired; pick another accelerator` };
  if (when === "submit")
    throw new Conflict(
      `the budget is costed on ${a.name}, which is retired from the catalog; pick another accelerator before submitting`,
      fields,
    );
  throw new Invalid(`${a.name} is retired from the catalog; pick another accelerator`, fields);
}
export const keptAcceleratorOf = catalogId;
