import { currentBudgetNames } from "@shared/budget-legacy-names";
import type { PlanBudgetInput } from "@shared/schemas/plans";
import { parseNumberText } from "@/lib/number-text";
import { GIB, TFLOPS } from "@/lib/format";
import {
  defaultSettings,
  settingsRequest,
  type ClusterDraft,
  type SettingsDraft,
  type StageDraft,
} from "./sheet-draft";

/** The plan fields the sheet edits; the rest of a stage (target, method, rate, data mix) belongs to the plan editor. */
export const PLAN_STAGE_FIELDS = ["sequenceLength", "globalBatch", "steps"] as const;
export type PlanStageField = (typeof PLAN_STAGE_FIELDS)[number];
export type PlanStageNumbers = Partial<Record<PlanStageField, number>>;

const text = (v: number | undefined) => (v === undefined ? "" : String(v));

/** A stored budget block as sheet inputs; no block yet: a catalog accelerator still to pick. */
export function draftFromPlanBudget(budget: PlanBudgetInput | undefined): {
  cluster: ClusterDraft;
  settings: SettingsDraft;
} {
  const blank: ClusterDraft = { kind: "catalog", acceleratorId: "", peakTflops: "", memoryGib: "", pricePerHour: "" };
  if (!budget) return { cluster: blank, settings: defaultSettings() };
  // Budget model 1's names read as their replacements, so saving again writes only the new ones.
  const current = currentBudgetNames(budget);
  const c = budget.cluster as Record<string, number | undefined>;
  const cluster: ClusterDraft =
    c.acceleratorId !== undefined
      ? { ...blank, acceleratorId: String(c.acceleratorId) }
      : {
          kind: "custom",
          acceleratorId: "",
          peakTflops: text(c.peakFlops === undefined ? undefined : c.peakFlops / TFLOPS),
          memoryGib: text(c.memoryBytes === undefined ? undefined : c.memoryBytes / GIB),
          pricePerHour: text(c.pricePerHour),
        };
  return {
    cluster,
    settings: {
      accelerators: text(budget.accelerators),
      utilization: text(budget.utilization),
      convention: budget.convention ?? "",
      activationCheckpointing: current.activationCheckpointing ?? "",
      flashAttention: budget.flashAttention === undefined ? "" : budget.flashAttention ? "on" : "off",
      contextParallel: text(current.contextParallel),
      lossChunks: text(budget.lossChunks),
      kvCacheBytesPerElement: text(budget.kvCacheBytesPerElement),
      measuredTokensPerSecond: text(budget.measuredTokensPerSecond),
      measuredSequenceLength: text(budget.measuredSequenceLength),
      vocabSize: text(budget.vocabSize),
      optimizerBytesPerParameter: text(budget.optimizerBytesPerParameter),
      microBatchSequences: text(budget.microBatchSequences),
    },
  };
}

/** Sheet inputs as the plan's budget block; undefined while no accelerator is chosen (the plan then carries no budget). */
export function planBudgetFromDraft(draft: {
  cluster: ClusterDraft;
  settings: SettingsDraft;
}): PlanBudgetInput | undefined {
  if (draft.cluster.kind === "catalog" && draft.cluster.acceleratorId.trim() === "") return undefined;
  const request = settingsRequest(draft);
  const defined = (o: object) => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined));
  return { ...defined(request), cluster: defined(request.cluster) } as PlanBudgetInput;
}

const same = (a: number | undefined, b: number | undefined) => a === b || (Number.isNaN(a) && Number.isNaN(b));

/**
 * Stage rows for the sheet from the plan's numbers. `typed` keeps what was typed in the sheet ("i.field" → text)
 * while it still stands for the plan's number, so a half-typed value is not rewritten under the cursor.
 */
export function stageDraftsFromPlan(
  stages: PlanStageNumbers[],
  typed: Record<string, string>,
  recipes: (StageDraft["recipeId"] | undefined)[],
): StageDraft[] {
  return stages.map((s, i) => {
    const cell = (field: PlanStageField) => {
      const t = typed[`${i}.${field}`];
      if (t !== undefined && same(parseNumberText(t), s[field])) return t;
      return s[field] === undefined || Number.isNaN(s[field]) ? (t ?? "") : String(s[field]);
    };
    const recipeId = recipes[i];
    return {
      sequenceLength: cell("sequenceLength"),
      globalBatch: cell("globalBatch"),
      by: "steps",
      steps: cell("steps"),
      tokens: "",
      ...(recipeId ? { recipeId } : {}),
    };
  });
}
