import fc from "fast-check";
import { describe, expect, expectTypeOf, it } from "vitest";
import {
  BUDGET_RECIPES,
  estimateBudget,
  type BudgetEstimate,
  type BudgetRecipe,
  type ClusterSpec,
  type ModelShape,
  type ResolvedBudgetInput,
  type StageInput,
} from "../../../server/engine/budget";
import {
  budgetEstimateRequestSchema,
  budgetEstimateSchema,
  budgetRecipeSchema,
  clusterSpecSchema,
  modelShapeSchema,
  type BudgetEstimateResponse,
  type BudgetRecipeResponse,
  type ClusterRequest,
  type ModelRequest,
  type ParsedBudgetEstimateRequest,
  type StageRequest,
} from "../../../shared/schemas/budget";
import { plan, SHAPE_7B } from "./fixtures";

/** Every number anywhere inside a JSON-like value. */
function numbersIn(value: unknown): number[] {
  if (typeof value === "number") return [value];
  if (value && typeof value === "object") return Object.values(value).flatMap(numbersIn);
  return [];
}

// The engine keeps its own types (it imports nothing outside server/engine); these checks tie them to the
// shared zod contract. The type assertions fail `tsc`; the parses fail at run time.

describe("engine types match the shared contract", () => {
  it("response type is the same both ways", () => {
    expectTypeOf<BudgetEstimate>().toEqualTypeOf<BudgetEstimateResponse>();
    expectTypeOf<BudgetRecipe>().toExtend<BudgetRecipeResponse>();
  });

  it("a parsed request, its model and cluster resolved, is a ResolvedBudgetInput", () => {
    expectTypeOf<StageRequest>().toEqualTypeOf<StageInput>();
    expectTypeOf<Exclude<ModelRequest, { modelId: number }>>().toEqualTypeOf<ModelShape>();
    expectTypeOf<Exclude<ClusterRequest, { acceleratorId: number }>>().toEqualTypeOf<ClusterSpec>();
    expectTypeOf<Omit<ParsedBudgetEstimateRequest, "model" | "cluster"> & { model: ModelShape; cluster: ClusterSpec }>().toExtend<ResolvedBudgetInput>();
  });
});

describe("the service's path: parse, resolve, estimate, check the response against its schema", () => {
  it("the YaRN plan round-trips", () => {
    const parsed = budgetEstimateRequestSchema.parse({ ...plan(), stages: [{ sequenceLength: 65_536, steps: 400, globalBatch: 64 }] });
    const model = modelShapeSchema.parse(parsed.model);
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
      fc.property(fc.array(stage, { minLength: 1, maxLength: 32 }), fc.integer({ min: 1, max: 10_000 }), (stages, accelerators) => {
        const estimate = estimateBudget(plan({ stages, accelerators }));
        expect(budgetEstimateSchema.safeParse(estimate).success).toBe(true);
        expect(numbersIn(estimate).every(Number.isFinite)).toBe(true);
      }),
      { numRuns: 50 },
    );
  });

  it("the published recipes parse with the recipe schema", () => {
    for (const recipe of BUDGET_RECIPES) expect(budgetRecipeSchema.safeParse(recipe).success).toBe(true);
  });

  it("the shape fixture is a valid model shape", () => {
    expect(modelShapeSchema.safeParse(SHAPE_7B).success).toBe(true);
  });
});
