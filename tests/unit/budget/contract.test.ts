import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { BUDGET_RECIPES, estimateBudget } from "../../../server/engine/budget";
import {
  budgetEstimateRequestSchema,
  budgetEstimateSchema,
  budgetRecipeSchema,
  clusterSpecSchema,
  budgetModelShapeSchema,
} from "../../../shared/schemas/budget";
import { plan, SHAPE_7B } from "./fixtures";

/** Every number anywhere inside a JSON-like value. */
function numbersIn(value: unknown): number[] {
  if (typeof value === "number") return [value];
  if (value && typeof value === "object") return Object.values(value).flatMap(numbersIn);
  return [];
}

// The engine's types are the contract's (z.output); these check the values at run time.
describe("the service's path: parse, resolve, estimate, check the response against its schema", () => {
  it("the YaRN plan round-trips", () => {
    const parsed = budgetEstimateRequestSchema.parse({
      ...plan(),
      stages: [{ sequenceLength: 65_536, steps: 400, globalBatch: 64 }],
    });
    const model = budgetModelShapeSchema.parse(parsed.model);
    const cluster = clusterSpecSchema.parse(parsed.cluster);
    const estimate = estimateBudget({ ...parsed, model, cluster });
    expect(budgetEstimateSchema.safeParse(estimate).success).toBe(true);
    expect(estimate.stages[0].tokens).toBe(1_677_721_600);
  });

  it("any valid small plan gives a response the schema accepts, with finite numbers throughout", () => {
    const stage = fc.record({
      sequenceLength: fc.integer({ min: 1, max: 2 ** 21 }),
      globalBatch: fc.integer({ min: 1, max: 4096 }),
      steps: fc.integer({ min: 1, max: 1e6 }),
    });
    fc.assert(
      fc.property(
        fc.array(stage, { minLength: 1, maxLength: 32 }),
        fc.integer({ min: 1, max: 10_000 }),
        (stages, accelerators) => {
          const estimate = estimateBudget(plan({ stages, accelerators }));
          expect(budgetEstimateSchema.safeParse(estimate).success).toBe(true);
          expect(numbersIn(estimate).every(Number.isFinite)).toBe(true);
        },
      ),
      { numRuns: 50 },
    );
  });

  it("the published recipes parse with the recipe schema", () => {
    for (const recipe of BUDGET_RECIPES) expect(budgetRecipeSchema.safeParse(recipe).success).toBe(true);
  });

  it("the shape fixture is a valid model shape", () => {
    expect(budgetModelShapeSchema.safeParse(SHAPE_7B).success).toBe(true);
  });
});
