import type { BudgetRecipeResponse, StageRequest } from "./schemas/budget";
import { stageTokens } from "./stage-tokens";

/**
 * A training stage from what a paper reported, for the budget engine and the budget sheets: the paper's length when it
 * gave one, else `targetContext`; its global batch, else `fallbackGlobalBatch`; its steps when reported, else its tokens.
 * `stepsOnly` (a plan's stages are given by steps) turns a token count into the whole steps that reach it.
 */
export function recipeStage(
  recipe: BudgetRecipeResponse,
  targetContext: number,
  fallbackGlobalBatch: number,
  stepsOnly = false,
): StageRequest {
  const sequenceLength = recipe.reported.sequenceLength ?? targetContext;
  const globalBatch = recipe.reported.globalBatch ?? fallbackGlobalBatch;
  if (recipe.reported.steps !== undefined) return { sequenceLength, globalBatch, steps: recipe.reported.steps };
  if (recipe.reported.tokens === undefined)
    throw new RangeError(`recipe ${recipe.id} reports neither steps nor tokens`);
  const byTokens = { sequenceLength, globalBatch, tokens: recipe.reported.tokens };
  return stepsOnly ? { sequenceLength, globalBatch, steps: stageTokens(byTokens).steps } : byTokens;
}
