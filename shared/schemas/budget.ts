import { z } from "zod";
import { dbIdSchema } from "./common";

/*
 * Budget contract: POST /api/budgets/estimate and the accelerator catalog.
 * Defaults are not applied here: the engine applies them and reports each in `assumptions.defaulted`.
 * z.number() already rejects NaN and ±Infinity; the upper limits keep every product finite.
 */

export const MAX_BUDGET_STAGES = 32;
export const MAX_SEQUENCE_LENGTH = 2 ** 27;
export const FLOP_CONVENTIONS = ["causal", "full"] as const;
export const BUDGET_RECIPE_IDS = ["position-interpolation", "yarn", "adjusted-base"] as const;

const count = (max: number) => z.number().int().positive().max(max);
const amount = (max: number) => z.number().positive().max(max);
/*
 * Lower bounds on the divisors of the estimate, so a denormal (5e-324) cannot make an hour, a cost or a KV-cache
 * count infinite (and the revision's canonical hash then refuses it). Each is far below any real value:
 * 1 GFLOP/s peak, 0.1 % utilisation, 1 bit per element.
 */
export const MIN_PEAK_FLOPS = 1e9;
export const MIN_UTILIZATION = 1e-3;
export const MIN_BYTES_PER_ELEMENT = 0.125;
const id = dbIdSchema;
const length = count(MAX_SEQUENCE_LENGTH);

// ---- accelerator catalog ----------------------------------------------------------------

const acceleratorFields = {
  name: z.string().trim().min(1).max(100),
  memoryBytes: count(1e15),
  /** Dense peak FLOP/s at the training precision (no sparsity figure). */
  peakFlops: amount(1e18).min(MIN_PEAK_FLOPS, `at least ${MIN_PEAK_FLOPS} FLOP/s`),
  /** Price per accelerator-hour, in the workspace's currency. */
  pricePerHour: z.number().nonnegative().max(1e6),
};

export const acceleratorInputSchema = z.object({ ...acceleratorFields, notes: z.string().max(2000).optional() });
export const acceleratorUpdateSchema = acceleratorInputSchema.partial();
/** `retiredAt`: when a used accelerator left the pickers (ISO time), or null while it is offered. */
export const acceleratorSchema = z.object({
  id,
  ...acceleratorFields,
  notes: z.string(),
  retiredAt: z.string().nullable(),
});
export type AcceleratorInput = z.infer<typeof acceleratorInputSchema>;
export type AcceleratorUpdate = z.infer<typeof acceleratorUpdateSchema>;
export type Accelerator = z.infer<typeof acceleratorSchema>;

// ---- request -----------------------------------------------------------------------------

/*
 * Either-or inputs are one object with a rule, not a z.union: when both variants of a union fail on a
 * type error (NaN, null, 2.5 where an integer goes) zod names only the object, never the field.
 */

const modelShapeFields = {
  /** Used for both FLOPs (6N) and weight memory. */
  parameters: count(1e15),
  layers: count(10_000),
  attentionHeads: count(10_000),
  kvHeads: count(10_000),
  headDim: count(65_536),
  /** Residual width; default attentionHeads × headDim. */
  hiddenSize: count(1_000_000).optional(),
  /** Bytes per stored element of weights, activations and KV cache; default 2 (bf16/fp16). */
  bytesPerElement: amount(16).min(MIN_BYTES_PER_ELEMENT, "at least 0.125 (one bit)").optional(),
};
const REQUIRED_MODEL_FIELDS = ["parameters", "layers", "attentionHeads", "kvHeads", "headDim"] as const;

type HeadCounts = { attentionHeads?: number; kvHeads?: number };
function checkKvGroups(model: HeadCounts, ctx: z.RefinementCtx) {
  if (model.attentionHeads === undefined || model.kvHeads === undefined) return;
  if (model.attentionHeads % model.kvHeads !== 0) {
    ctx.addIssue({ code: "custom", path: ["kvHeads"], message: "kvHeads must divide attentionHeads" });
  }
}

/** A model's shape on its own (strict: a misspelled field is an error, not silently dropped). */
export const budgetModelShapeSchema = z.strictObject(modelShapeFields).superRefine(checkKvGroups);
export type BudgetModelShape = z.output<typeof budgetModelShapeSchema>;

/**
 * `{ ...ref }` or the shape's fields, never both; the shape's `required` fields must all be there
 * when the ref is absent. Strict, so a misspelled field is an error.
 */
function refOrShape<R extends z.ZodRawShape, S extends z.ZodRawShape>(ref: R, shape: S, required: readonly string[]) {
  const refKeys = Object.keys(ref);
  return z
    .strictObject({ ...ref, ...shape })
    .partial()
    .superRefine((value, ctx) => {
      const given = (key: string) => (value as Record<string, unknown>)[key] !== undefined;
      if (refKeys.some(given)) {
        for (const key of Object.keys(shape).filter(given)) {
          ctx.addIssue({ code: "custom", path: [key], message: `give ${refKeys.join(", ")} or ${key}, not both` });
        }
        return;
      }
      for (const key of required.filter((k) => !given(k))) {
        ctx.addIssue({ code: "custom", path: [key], message: `required unless ${refKeys.join(", ")} is given` });
      }
    });
}

export type ModelRequest = { modelId: number } | BudgetModelShape;
export const budgetModelSchema = refOrShape({ modelId: id }, modelShapeFields, REQUIRED_MODEL_FIELDS)
  .superRefine(checkKvGroups)
  .transform((model) => model as ModelRequest);

const clusterSpecFields = {
  peakFlops: acceleratorFields.peakFlops,
  memoryBytes: acceleratorFields.memoryBytes,
  pricePerHour: acceleratorFields.pricePerHour,
};
export const clusterSpecSchema = z.strictObject(clusterSpecFields);
export type ClusterRequest = { acceleratorId: number } | z.output<typeof clusterSpecSchema>;
export const budgetClusterSchema = refOrShape(
  { acceleratorId: id },
  clusterSpecFields,
  Object.keys(clusterSpecFields),
).transform((cluster) => cluster as ClusterRequest);

type StageCommon = { sequenceLength: number; globalBatch: number };
/** A stage by steps, or by a token target from which the engine derives steps. */
export type StageRequest =
  (StageCommon & { steps: number; tokens?: undefined }) | (StageCommon & { tokens: number; steps?: undefined });

// Steps or a token target: one object with an either-or rule, as above.
export const budgetStageRequestSchema = z
  .object({
    sequenceLength: length,
    /** Sequences per optimizer step, across all accelerators. */
    globalBatch: count(1e8),
    steps: count(1e9).optional(),
    tokens: amount(1e16).optional(),
  })
  .superRefine((stage, ctx) => {
    const hasSteps = stage.steps !== undefined;
    const hasTokens = stage.tokens !== undefined;
    if (hasSteps && hasTokens)
      ctx.addIssue({ code: "custom", path: ["tokens"], message: "give steps or tokens, not both" });
    if (!hasSteps && !hasTokens)
      ctx.addIssue({ code: "custom", path: ["steps"], message: "give steps or a token target" });
  })
  .transform((stage) => stage as StageRequest);

/** Cluster size and training conventions: shared by the estimator and a plan's budget sheet. */
export const budgetSettingsFields = {
  accelerators: count(1_000_000),
  /** Model FLOPs utilisation in (0, 1]. */
  utilization: z.number().positive().min(MIN_UTILIZATION, "at least 0.001").max(1).optional(),
  convention: z.enum(FLOP_CONVENTIONS).optional(),
  recomputeFraction: z.number().min(0).max(1).optional(),
  optimizerBytesPerParameter: amount(64).optional(),
  /** Sequence-parallel degree for the reported training memory; default 1. */
  sequenceSharding: count(1_000_000).optional(),
  /** Sequences per micro-batch on one data-parallel rank; default 1. */
  microBatchSequences: count(1_000_000).optional(),
};

export const budgetEstimateRequestSchema = z
  .object({
    model: budgetModelSchema,
    cluster: budgetClusterSchema,
    ...budgetSettingsFields,
    /** Growth curve start; default the shortest stage length. */
    trainedContext: length.optional(),
    /** Growth curve runs to 4 × this; default the longest stage length. */
    targetContext: length.optional(),
    /** Log-spaced growth points, both ends included; default 9. */
    growthPoints: z.number().int().min(2).max(64).optional(),
    stages: z.array(budgetStageRequestSchema).min(1).max(MAX_BUDGET_STAGES),
  })
  .superRefine((request, ctx) => {
    if (request.sequenceSharding !== undefined && request.sequenceSharding > request.accelerators) {
      ctx.addIssue({
        code: "custom",
        path: ["sequenceSharding"],
        message: "sequenceSharding cannot exceed accelerators",
      });
    }
    // Same fallbacks as the engine: shortest and longest stage lengths.
    const lengths = request.stages.map((s) => s.sequenceLength);
    const trained = request.trainedContext ?? Math.min(...lengths);
    const target = request.targetContext ?? Math.max(...lengths);
    if (trained > target) {
      const path = request.targetContext !== undefined ? "targetContext" : "trainedContext";
      ctx.addIssue({ code: "custom", path: [path], message: "trainedContext cannot exceed targetContext" });
    }
  });
export type BudgetEstimateRequest = z.input<typeof budgetEstimateRequestSchema>;
export type ParsedBudgetEstimateRequest = z.output<typeof budgetEstimateRequestSchema>;

// ---- response ----------------------------------------------------------------------------

const nonNegative = z.number().nonnegative();

export const budgetStageEstimateSchema = z.object({
  index: z.number().int().nonnegative(),
  sequenceLength: z.number(),
  globalBatch: z.number(),
  steps: z.number(),
  /** The requested token target, or null when the stage was given by steps. */
  tokenTarget: z.number().nullable(),
  /** Tokens actually trained: steps × globalBatch × sequenceLength. */
  tokens: nonNegative,
  cumulativeTokens: nonNegative,
  flopsPerToken: nonNegative,
  /** The attention term of flopsPerToken, before the recomputation factor. */
  attentionFlopsPerToken: nonNegative,
  flops: nonNegative,
  acceleratorHours: nonNegative,
  wallClockHours: nonNegative,
  cost: nonNegative,
  kvCacheBytesPerToken: nonNegative,
  kvCacheBytesPerSequence: nonNegative,
  servingSequencesPerAccelerator: z.number().int().nonnegative(),
  trainingMemoryPerAccelerator: nonNegative,
  /** modelStates: weights + grads + optimizer states; activations: layer-input checkpoints; both per accelerator. */
  trainingMemory: z.object({ modelStates: nonNegative, activations: nonNegative, total: nonNegative }),
  fits: z.boolean(),
  minSequenceSharding: z.number().int().positive().nullable(),
  warnings: z.array(z.string()),
});

export const budgetTotalsSchema = z.object({
  tokens: nonNegative,
  flops: nonNegative,
  acceleratorHours: nonNegative,
  wallClockHours: nonNegative,
  cost: nonNegative,
});

export const budgetGrowthPointSchema = z.object({
  sequenceLength: z.number(),
  flopsPerToken: nonNegative,
  /** Share of flopsPerToken spent in the attention term. */
  attentionShare: z.number().min(0).max(1),
  acceleratorHoursPerBillionTokens: nonNegative,
  costPerBillionTokens: nonNegative,
});

export const budgetAssumptionsSchema = z.object({
  convention: z.enum(FLOP_CONVENTIONS),
  conventionFormula: z.string(),
  conventionSource: z.string(),
  utilization: z.number(),
  utilizationSource: z.string(),
  recomputeFraction: z.number(),
  optimizerBytesPerParameter: z.number(),
  optimizerBytesSource: z.string(),
  bytesPerElement: z.number(),
  hiddenSize: z.number(),
  sequenceSharding: z.number(),
  microBatchSequences: z.number(),
  trainedContext: z.number(),
  targetContext: z.number(),
  /** Inputs that were left out and took their default. */
  defaulted: z.array(z.string()),
  memoryModel: z.array(z.string()),
  notes: z.array(z.string()),
});

export const budgetEstimateSchema = z.object({
  stages: z.array(budgetStageEstimateSchema),
  totals: budgetTotalsSchema,
  growth: z.array(budgetGrowthPointSchema),
  assumptions: budgetAssumptionsSchema,
});
export type BudgetEstimateResponse = z.infer<typeof budgetEstimateSchema>;

// ---- published recipes (GET, read-only) --------------------------------------------------

export const budgetRecipeSchema = z.object({
  id: z.enum(BUDGET_RECIPE_IDS),
  name: z.string(),
  source: z.object({ authors: z.string(), year: z.number().int(), title: z.string() }),
  reported: z.object({
    steps: z.number().optional(),
    globalBatch: z.number().optional(),
    learningRate: z.number().optional(),
    sequenceLength: z.number().optional(),
    tokens: z.number().optional(),
  }),
  /** Plain words on what the figures are. */
  summary: z.string(),
});
export type BudgetRecipeResponse = z.infer<typeof budgetRecipeSchema>;

// ---- response envelopes (as the routers send them) ----------------------------------------

export const acceleratorListResponseSchema = z.object({ accelerators: z.array(acceleratorSchema) });
export const acceleratorResponseSchema = z.object({ accelerator: acceleratorSchema });
/** DELETE /api/accelerators/:id on an accelerator plans were costed on: retired instead, with those plans. */
export const acceleratorRetiredResponseSchema = z.object({
  retired: z.literal(true),
  accelerator: acceleratorSchema,
  usedBy: z.array(z.object({ id, title: z.string() })),
});

export const budgetRecipesResponseSchema = z.object({ recipes: z.array(budgetRecipeSchema), caution: z.string() });

/** POST /api/budgets/estimate: the estimate plus the numbers that `modelId` / `acceleratorId` stood for. */
export const budgetEstimateResultSchema = budgetEstimateSchema.extend({
  resolved: z.object({
    model: z.object(modelShapeFields),
    cluster: clusterSpecSchema,
    acceleratorName: z.string().nullable(),
  }),
});
export type BudgetEstimateResult = z.infer<typeof budgetEstimateResultSchema>;

/** A plan's budget inputs as stored in a revision (same fields as plans' planBudgetSchema). */
const storedBudgetInputsSchema = z.object({ cluster: budgetClusterSchema, ...budgetSettingsFields });

/**
 * `content.budget` of a plan revision: the figures with the catalog numbers copied in at edit time,
 * or why they were skipped (a plan with no stages).
 */
export const revisionBudgetSchema = z.union([
  z.object({
    inputs: storedBudgetInputsSchema,
    cluster: z.object({ name: z.string().nullable(), ...clusterSpecFields }),
    estimate: budgetEstimateSchema,
  }),
  z.object({ inputs: storedBudgetInputsSchema, skipped: z.string() }),
]);
export type RevisionBudget = z.infer<typeof revisionBudgetSchema>;
