import type { BUDGET_RECIPE_IDS, BudgetRecipeResponse } from "../../../shared/schemas/budget";

export type BudgetRecipeId = (typeof BUDGET_RECIPE_IDS)[number];
/** What a paper reported for its own runs. Shown beside a plan as a starting point, never as a prediction. */
export type BudgetRecipe = BudgetRecipeResponse;

export const RECIPE_CAUTION =
  "Figures as the paper reported them for its own models and data; a starting point, not a prediction for this plan.";

// Author lists and titles are from memory; the figures are the ones listed in docs/budget-conventions.md.
export const BUDGET_RECIPES: readonly BudgetRecipe[] = [
  {
    id: "position-interpolation",
    name: "Position Interpolation fine-tune",
    source: {
      authors: "Chen, Wong, Chen, Tian",
      year: 2023,
      title: "Extending Context Window of Large Language Models via Positional Interpolation",
    },
    reported: { steps: 1000, globalBatch: 64, learningRate: 2e-5 },
    summary: "1000 steps at global batch 64, learning rate 2e-5, at the extended length.",
  },
  {
    id: "yarn",
    name: "YaRN fine-tune",
    source: {
      authors: "Peng, Quesnelle, Fan, Shippole",
      year: 2023,
      title: "YaRN: Efficient Context Window Extension of Large Language Models",
    },
    reported: { steps: 400, globalBatch: 64, sequenceLength: 65_536 },
    summary: "400 steps at 64k tokens per sequence, global batch 64: about 0.1% of the pre-training data.",
  },
  {
    id: "adjusted-base",
    name: "Adjusted base, continued pre-training",
    source: { authors: "Xiong et al.", year: 2023, title: "Effective Long-Context Scaling of Foundation Models" },
    reported: { tokens: 400e9 },
    summary: "400B tokens of continued pre-training with the rotary base raised from 10 000 to 500 000.",
  },
];

export function findRecipe(id: BudgetRecipeId): BudgetRecipe {
  const recipe = BUDGET_RECIPES.find((r) => r.id === id);
  if (!recipe) throw new RangeError(`unknown budget recipe: ${id}`);
  return recipe;
}

// A stage built from a recipe is the same rule for the engine and the budget sheets: shared/recipe-stage.ts.
export { recipeStage } from "../../../shared/recipe-stage";
