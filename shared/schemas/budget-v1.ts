import { z } from "zod";

/*
 * The budget as revisions frozen before the memory model of budget model 2 stored it (no `budgetModel` field).
 * These shapes are frozen: a signed revision's content is read with them and shown as it was signed, never
 * recomputed with a newer model. Do not edit; add a new version beside it instead.
 */

const nonNegative = z.number().nonnegative();

/** Settings as budget model 1 stored them in a revision's `budget.inputs` (the catalog ref or custom figures). */
export const budgetInputsV1Schema = z.object({
  cluster: z.union([
    z.object({ acceleratorId: z.number() }),
    z.object({ peakFlops: z.number(), memoryBytes: z.number(), pricePerHour: z.number() }),
  ]),
  accelerators: z.number(),
  utilization: z.number().optional(),
  convention: z.enum(["causal", "full"]).optional(),
  recomputeFraction: z.number().optional(),
  optimizerBytesPerParameter: z.number().optional(),
  sequenceSharding: z.number().optional(),
  microBatchSequences: z.number().optional(),
});

export const budgetStageEstimateV1Schema = z.object({
  index: z.number().int().nonnegative(),
  sequenceLength: z.number(),
  globalBatch: z.number(),
  steps: z.number(),
  tokenTarget: z.number().nullable(),
  tokens: nonNegative,
  cumulativeTokens: nonNegative,
  flopsPerToken: nonNegative,
  attentionFlopsPerToken: nonNegative,
  flops: nonNegative,
  acceleratorHours: nonNegative,
  wallClockHours: nonNegative,
  cost: nonNegative,
  kvCacheBytesPerToken: nonNegative,
  kvCacheBytesPerSequence: nonNegative,
  servingSequencesPerAccelerator: z.number().int().nonnegative(),
  trainingMemoryPerAccelerator: nonNegative,
  trainingMemory: z.object({ modelStates: nonNegative, activations: nonNegative, total: nonNegative }),
  fits: z.boolean(),
  minSequenceSharding: z.number().int().positive().nullable(),
  warnings: z.array(z.string()),
});

const totalsV1Schema = z.object({
  tokens: nonNegative,
  flops: nonNegative,
  acceleratorHours: nonNegative,
  wallClockHours: nonNegative,
  cost: nonNegative,
});

const growthPointV1Schema = z.object({
  sequenceLength: z.number(),
  flopsPerToken: nonNegative,
  attentionShare: z.number().min(0).max(1),
  acceleratorHoursPerBillionTokens: nonNegative,
  costPerBillionTokens: nonNegative,
});

export const budgetAssumptionsV1Schema = z.object({
  convention: z.enum(["causal", "full"]),
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
  defaulted: z.array(z.string()),
  memoryModel: z.array(z.string()),
  notes: z.array(z.string()),
});

export const budgetEstimateV1Schema = z.object({
  stages: z.array(budgetStageEstimateV1Schema),
  totals: totalsV1Schema,
  growth: z.array(growthPointV1Schema),
  assumptions: budgetAssumptionsV1Schema,
});

const clusterV1Schema = z.object({
  name: z.string().nullable(),
  peakFlops: z.number(),
  memoryBytes: z.number(),
  pricePerHour: z.number(),
});

/** `content.budget` of a revision frozen under budget model 1. */
export const revisionBudgetV1Schema = z.union([
  z.object({ inputs: budgetInputsV1Schema, cluster: clusterV1Schema, estimate: budgetEstimateV1Schema }),
  z.object({ inputs: budgetInputsV1Schema, skipped: z.string() }),
]);
export type RevisionBudgetV1 = z.infer<typeof revisionBudgetV1Schema>;
