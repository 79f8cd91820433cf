/**
 * Budget engine: tokens, FLOPs, accelerator-hours, cost and memory of a context-extension run.
 * Pure functions only; the service resolves modelId / acceleratorId to numbers before calling.
 * Formulas and their sources: docs/budget-conventions.md; each is tested in tests/unit/budget.
 */
export { estimateBudget } from "./budget/estimate";
export {
  acceleratorCost,
  acceleratorHours,
  attentionFlopsPerToken,
  checkpointingFlopsPerToken,
  flopsPerToken,
  measuredUtilization,
  parameterFlopsPerToken,
  wallClockHours,
  type FlopOptions,
} from "./budget/flops";
export {
  dataParallelRanks,
  hiddenSizeOf,
  largestMemoryTerm,
  trainingMemoryPerAccelerator,
  type TrainingMemoryInput,
} from "./budget/memory";
export {
  kvCacheBytesPerSequence,
  kvCacheBytesPerToken,
  longestServableContext,
  servingSequencesPerAccelerator,
  weightBytes,
} from "./budget/kv-cache";
export { cheapestFit } from "./budget/fit";
export { BUDGET_CONVENTIONS } from "./budget/conventions";
export { cumulativeTokens, stageTokens, tokensPerStep, type StageTokens } from "../../shared/stage-tokens";
export { growthCurve, logSpacedLengths } from "./budget/growth";
export {
  BUDGET_RECIPES,
  RECIPE_CAUTION,
  findRecipe,
  recipeStage,
  type BudgetRecipe,
  type BudgetRecipeId,
} from "./budget/recipes";
export { BUDGET_DEFAULTS, GROWTH_REACH } from "./budget/defaults";
export type * from "./budget/types";
