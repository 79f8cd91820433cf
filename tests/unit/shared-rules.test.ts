import { describe, expect, it } from "vitest";
import { effectiveRequiredApprovals, isSigned, latestApproved } from "../../shared/plan-rules";
import { planBudgetContexts } from "../../shared/plan-budget";
import { recipeStage } from "../../shared/recipe-stage";
import { findRecipe } from "../../server/engine/budget";
import { recipeStageDraft } from "../../client/src/features/budgets/lib/recipes";
import { isObj, num, numberOr } from "../../shared/json-values";
import { REVISION_STATES, type RevisionState } from "../../shared/schemas/plans";

/*
 * Rules that the server and the client both apply, now written once in shared/. Every expected value below is worked
 * by hand in its comment; none is copied from a run of the code.
 */

describe("recipe stages (shared/recipe-stage.ts)", () => {
  it("YaRN reports steps, batch and length: the stage is the paper's whatever the plan's target", () => {
    // Peng et al. 2023: 400 steps × 64 sequences × 65 536 tokens.
    expect(recipeStage(findRecipe("yarn"), 131_072, 32)).toEqual({
      sequenceLength: 65_536,
      globalBatch: 64,
      steps: 400,
    });
  });

  it("Position Interpolation reports no length: the plan's target stands in", () => {
    // Chen et al. 2023: 1000 steps at batch 64, at the extended length (here 8192).
    expect(recipeStage(findRecipe("position-interpolation"), 8192, 32)).toEqual({
      sequenceLength: 8192,
      globalBatch: 64,
      steps: 1000,
    });
  });

  it("a token count stays tokens, or becomes the whole steps that reach it when stages are given by steps", () => {
    // Xiong et al. 2023: 400e9 tokens; no batch reported, so 128 × 32 768 = 4 194 304 tokens a step;
    // 400e9 / 4 194 304 = 95 367.4…, so 95 368 whole steps (95 367 steps would train 399 998 189 568 tokens, too few).
    const recipe = findRecipe("adjusted-base");
    expect(recipeStage(recipe, 32_768, 128)).toEqual({ sequenceLength: 32_768, globalBatch: 128, tokens: 400e9 });
    expect(recipeStage(recipe, 32_768, 128, true)).toEqual({ sequenceLength: 32_768, globalBatch: 128, steps: 95_368 });
  });

  it("the budget sheet's row is the same stage, as text", () => {
    expect(recipeStageDraft(findRecipe("adjusted-base"), 32_768, 128, true)).toEqual({
      sequenceLength: "32768",
      globalBatch: "128",
      recipeId: "adjusted-base",
      by: "steps",
      steps: "95368",
      tokens: "",
    });
    expect(recipeStageDraft(findRecipe("adjusted-base"), 32_768, 128)).toMatchObject({
      by: "tokens",
      tokens: "400000000000",
    });
  });
});

describe("plan budget lengths (shared/plan-budget.ts)", () => {
  it("costs up to the longest of the target and the stages", () => {
    // Trained 4096, target 32 768, a stage at 65 536 trains past the target: 65 536.
    expect(planBudgetContexts(4096, 32_768, [16_384, 65_536])).toEqual({ trainedContext: 4096, targetContext: 65_536 });
    expect(planBudgetContexts(4096, 32_768, [16_384])).toEqual({ trainedContext: 4096, targetContext: 32_768 });
  });

  it("leaves out lengths not typed yet and never goes below the trained length", () => {
    expect(planBudgetContexts(4096, Number.NaN, [undefined, 8192])).toEqual({
      trainedContext: 4096,
      targetContext: 8192,
    });
    expect(planBudgetContexts(4096, undefined, [])).toEqual({ trainedContext: 4096, targetContext: 4096 });
    expect(planBudgetContexts(4096, 2048, [1024])).toEqual({ trainedContext: 4096, targetContext: 4096 });
  });
});

describe("sign-off rules (shared/plan-rules.ts)", () => {
  const revs = (...states: RevisionState[]) => states.map((state, i) => ({ number: i + 1, state }));

  it("the signed revision is the highest-numbered approved one, in any order", () => {
    // r1 signed then superseded by r2; r3 is a new draft: the plan's signed revision is r2.
    expect(latestApproved(revs("superseded", "approved", "draft"))?.number).toBe(2);
    expect(latestApproved([...revs("superseded", "approved", "draft")].reverse())?.number).toBe(2);
    expect(latestApproved(revs("draft", "in_review", "changes_requested"))).toBeUndefined();
    expect(latestApproved([])).toBeUndefined();
  });

  it("approved and superseded revisions are signed; no other state is", () => {
    const signed = REVISION_STATES.filter(isSigned);
    expect(signed).toEqual(["approved", "superseded"]);
  });

  it("a plan needs what it asks for, raised to the lab minimum", () => {
    expect(effectiveRequiredApprovals(1, 2)).toBe(2);
    expect(effectiveRequiredApprovals(3, 2)).toBe(3);
    expect(effectiveRequiredApprovals(2, 2)).toBe(2);
  });
});

describe("JSON value readers (shared/json-values.ts)", () => {
  it("an object is neither null nor an array; a number is any JS number, NaN and Infinity included", () => {
    expect([{}, { a: 1 }, null, [], "x", 1].map(isObj)).toEqual([true, true, false, false, false, false]);
    // JSON.parse("1e999") is Infinity: the targets' readers take it as json.load would (a float inf).
    expect([1.5, JSON.parse("1e999"), "8", null, undefined].map((v) => num(v))).toEqual([
      1.5,
      Infinity,
      undefined,
      undefined,
      undefined,
    ]);
    expect([numberOr(0, 32), numberOr("32", 1), numberOr(null, 10000)]).toEqual([0, 1, 10000]);
  });
});
