import type { BudgetRecipeResponse } from "@shared/schemas/budget";
import { recipeStage } from "@shared/recipe-stage";
import { parseNumberText } from "@/lib/number-text";
import type { StageDraft } from "./sheet-draft";

/** A sheet row from what a paper reported: shared/recipe-stage.ts's stage, as the sheet's texts. */
export function recipeStageDraft(
  recipe: BudgetRecipeResponse,
  targetLength: number,
  fallbackBatch: number,
  stepsOnly = false,
): StageDraft {
  const stage = recipeStage(recipe, targetLength, fallbackBatch, stepsOnly);
  const base = {
    sequenceLength: String(stage.sequenceLength),
    globalBatch: String(stage.globalBatch),
    recipeId: recipe.id,
  };
  if (stage.steps !== undefined) return { ...base, by: "steps", steps: String(stage.steps), tokens: "" };
  return { ...base, by: "tokens", steps: "", tokens: String(stage.tokens) };
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
