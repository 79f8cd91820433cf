import { describe, expect, it } from "vitest";
import { BUDGET_RECIPES, findRecipe, RECIPE_CAUTION, recipeStage, stageTokens } from "../../../server/engine/budget";

// Figures as given in docs/budget-conventions.md, each from the paper named beside it.

describe("published recipes", () => {
  it("Position Interpolation (Chen et al. 2023): 1000 steps, global batch 64, lr 2e-5", () => {
    const recipe = findRecipe("position-interpolation");
    expect(recipe.reported).toEqual({ steps: 1000, globalBatch: 64, learningRate: 2e-5 });
    expect(recipe.source).toMatchObject({ year: 2023, authors: expect.stringMatching(/^Chen/) });
  });

  it("YaRN (Peng et al. 2023): 400 steps at 64k, batch 64", () => {
    const recipe = findRecipe("yarn");
    expect(recipe.reported).toEqual({ steps: 400, globalBatch: 64, sequenceLength: 65_536 });
    expect(recipe.source).toMatchObject({ year: 2023, authors: expect.stringMatching(/^Peng/) });
  });

  it("adjusted base (Xiong et al. 2023): 400B tokens", () => {
    const recipe = findRecipe("adjusted-base");
    expect(recipe.reported).toEqual({ tokens: 400e9 });
    expect(recipe.source).toMatchObject({ year: 2023, authors: expect.stringMatching(/^Xiong/) });
  });

  it("are labelled as reported figures, not predictions", () => {
    expect(RECIPE_CAUTION).toMatch(/reported/);
    expect(RECIPE_CAUTION).toMatch(/not a prediction/);
    expect(new Set(BUDGET_RECIPES.map((r) => r.id)).size).toBe(BUDGET_RECIPES.length);
  });
});

describe("recipe stages", () => {
  it("YaRN keeps its own 65 536 length: 400 × 64 × 65 536 = 1 677 721 600 tokens (derived)", () => {
    expect(stageTokens(recipeStage(findRecipe("yarn"), 131_072, 32)).tokens).toBe(1_677_721_600);
  });

  it("Position Interpolation runs at the plan's target: 1000 × 64 × 8192 = 524 288 000 (derived)", () => {
    expect(stageTokens(recipeStage(findRecipe("position-interpolation"), 8192, 32)).tokens).toBe(524_288_000);
  });

  // no batch reported → the fallback 128; 400e9 / (128 × 32 768) = 95 367.43 → 95 368 steps
  it("adjusted base becomes a token target at the plan's length with the fallback batch", () => {
    const stage = recipeStage(findRecipe("adjusted-base"), 32_768, 128);
    expect(stage).toEqual({ sequenceLength: 32_768, globalBatch: 128, tokens: 400e9 });
    expect(stageTokens(stage).steps).toBe(95_368);
  });
});
