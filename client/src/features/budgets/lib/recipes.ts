import type { BudgetRecipeResponse } from "@shared/schemas/budget";
import { parseNumberText } from "@/lib/number-text";
import type { StageDraft } from "./sheet-draft";

/**
 * A stage from what a paper reported, as the server's recipeStage does: the paper's length when it gave one,
 * else `targetLength`; its global batch, else `fallbackBatch`; its steps, else its token count.
 * `stepsOnly` (a plan's stages are given by steps) turns a token count into whole steps.
 */
export function recipeStageDraft(
  recipe: BudgetRecipeResponse,
  targetLength: number,
  fallbackBatch: number,
  stepsOnly = false,
): StageDraft {
  const length = recipe.reported.sequenceLength ?? targetLength;
  const batch = recipe.reported.globalBatch ?? fallbackBatch;
  const base = { sequenceLength: String(length), globalBatch: String(batch), recipeId: recipe.id };
  if (recipe.reported.steps !== undefined)
    return { ...base, by: "steps", steps: String(recipe.reported.steps), tokens: "" };
  const tokens = recipe.reported.tokens ?? 0;
  if (stepsOnly)
    return { ...base, by: "steps", steps: String(Math.max(1, Math.ceil(tokens / (batch * length)))), tokens: "" };
  return { ...base, by: "tokens", steps: "", tokens: String(tokens) };
}

/** True while the row still holds exactly what the paper reported (a length or batch it did not report may be anything). */
export function stillAsReported(stage: StageDraft, recipe: BudgetRecipeResponse): boolean {
  const r = recipe.reported;
  const same = (text: string, reported: number | undefined) =>
    reported === undefined || parseNumberText(text) === reported;
  if (!same(stage.sequenceLength, r.sequenceLength) || !same(stage.globalBatch, r.globalBatch)) return false;
  if (r.steps !== undefined) return stage.by === "steps" && same(stage.steps, r.steps);
  return stage.by === "tokens" && same(stage.tokens, r.tokens);
}

export const citation = (recipe: BudgetRecipeResponse) => `${recipe.source.authors} (${recipe.source.year})`;
