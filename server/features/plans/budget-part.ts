import type { Executor } from "../../db/client";
import { resolveAndEstimate } from "../budgets";
import { budgetShapeOf } from "../../../shared/profile-shapes";
import { planBudgetContexts } from "../../../shared/plan-budget";
import { Conflict, Invalid } from "../../platform/errors";
import { findAccelerator } from "../accelerators";
import { parseOr400 } from "../../platform/validate";
import { budgetEstimateRequestSchema } from "../../../shared/schemas/budget";
import type { RevisionValues } from "../../../shared/schemas";
import type { ModelSnapshot } from "./revision-content";

export type BudgetPart =
  | {
      inputs: NonNullable<RevisionValues["budget"]>;
      cluster: { name: string | null; peakFlops: number; memoryBytes: number; pricePerHour: number };
      estimate: Omit<Awaited<ReturnType<typeof resolveAndEstimate>>, "resolved">;
    }
  | { inputs: NonNullable<RevisionValues["budget"]>; skipped: string };

/**
 * The budget figures of a revision: the plan's stages on the chosen cluster, with the catalog's numbers copied in,
 * so a later price change in the catalog never alters a submitted revision.
 */
export async function budgetPart(
  ex: Executor,
  model: ModelSnapshot,
  v: RevisionValues,
): Promise<BudgetPart | undefined> {
  if (!v.budget) return undefined;
  if (!v.stages.length) return { inputs: v.budget, skipped: "the plan has no stages to cost" };
  const request = {
    ...v.budget,
    model: budgetShapeOf(model),
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
    // Name the plan's fields: budget.cluster.acceleratorId, budget.sequenceSharding, stages.N.…
    if (e instanceof Invalid) {
      const fields = Object.fromEntries(
        Object.entries(e.fields ?? {}).map(([k, m]) => [k.startsWith("stages.") ? k : `budget.${k}`, m]),
      );
      throw new Invalid(`the budget sheet is not valid: ${Object.keys(fields).join(", ")}`, fields);
    }
    throw e;
  }
  const { resolved, ...estimate } = out;
  return { inputs: v.budget, cluster: { name: resolved.acceleratorName, ...resolved.cluster }, estimate };
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
