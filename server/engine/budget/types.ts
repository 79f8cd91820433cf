/**
 * Inputs and outputs of the budget engine. The engine imports nothing outside server/engine,
 * so these mirror the zod contract in shared/schemas/budget.ts; tests/unit/budget/contract.test.ts
 * checks both directions of the match at compile time and parses real estimates with the schema.
 */

export type FlopConvention = "causal" | "full";

/** A model's shape as the budget needs it. `parameters` is used for both FLOPs (6N) and weight memory. */
export interface ModelShape {
  parameters: number;
  layers: number;
  attentionHeads: number;
  kvHeads: number;
  headDim: number;
  /** Residual width; defaults to attentionHeads × headDim. */
  hiddenSize?: number;
  /** Bytes per stored element of weights, activations and KV cache; default 2 (bf16/fp16). */
  bytesPerElement?: number;
}

/** One accelerator's figures: dense peak FLOP/s at training precision, memory in bytes, price per hour. */
export interface ClusterSpec {
  peakFlops: number;
  memoryBytes: number;
  pricePerHour: number;
}

interface StageCommon {
  sequenceLength: number;
  /** Sequences per optimizer step, across all accelerators. */
  globalBatch: number;
}
/** A stage is given either by its steps or by a token target from which steps are derived. */
export type StageInput =
  | (StageCommon & { steps: number; tokens?: undefined })
  | (StageCommon & { tokens: number; steps?: undefined });

export interface ResolvedBudgetInput {
  model: ModelShape;
  cluster: ClusterSpec;
  accelerators: number;
  utilization?: number;
  convention?: FlopConvention;
  recomputeFraction?: number;
  optimizerBytesPerParameter?: number;
  /** Sequence-parallel degree used for the reported training memory; default 1. */
  sequenceSharding?: number;
  /** Sequences per micro-batch on one data-parallel rank; default 1. */
  microBatchSequences?: number;
  /** Growth curve start; default the shortest stage length. */
  trainedContext?: number;
  /** Growth curve runs to 4 × this; default the longest stage length. */
  targetContext?: number;
  /** Number of log-spaced growth points, both ends included; default 9. */
  growthPoints?: number;
  stages: StageInput[];
}

export interface TrainingMemory {
  /** Weights + gradients + optimizer states per accelerator. */
  modelStates: number;
  /** Layer-input checkpoints per accelerator. */
  activations: number;
  total: number;
}

export interface StageEstimate {
  index: number;
  sequenceLength: number;
  globalBatch: number;
  steps: number;
  /** The requested token target, or null when the stage was given by steps. */
  tokenTarget: number | null;
  /** Tokens actually trained: steps × globalBatch × sequenceLength. */
  tokens: number;
  cumulativeTokens: number;
  flopsPerToken: number;
  /** The attention term of flopsPerToken, before the recomputation factor. */
  attentionFlopsPerToken: number;
  flops: number;
  acceleratorHours: number;
  wallClockHours: number;
  cost: number;
  kvCacheBytesPerToken: number;
  kvCacheBytesPerSequence: number;
  servingSequencesPerAccelerator: number;
  trainingMemoryPerAccelerator: number;
  trainingMemory: TrainingMemory;
  fits: boolean;
  minSequenceSharding: number | null;
  warnings: string[];
}

export interface BudgetTotals {
  tokens: number;
  flops: number;
  acceleratorHours: number;
  wallClockHours: number;
  cost: number;
}

export interface GrowthPoint {
  sequenceLength: number;
  flopsPerToken: number;
  /** Share of flopsPerToken spent in the attention term. */
  attentionShare: number;
  acceleratorHoursPerBillionTokens: number;
  costPerBillionTokens: number;
}

export interface BudgetAssumptions {
  convention: FlopConvention;
  conventionFormula: string;
  conventionSource: string;
  utilization: number;
  utilizationSource: string;
  recomputeFraction: number;
  optimizerBytesPerParameter: number;
  optimizerBytesSource: string;
  bytesPerElement: number;
  hiddenSize: number;
  sequenceSharding: number;
  microBatchSequences: number;
  trainedContext: number;
  targetContext: number;
  /** Names of inputs that were left out and took their default. */
  defaulted: string[];
  memoryModel: string[];
  notes: string[];
}

export interface BudgetEstimate {
  stages: StageEstimate[];
  totals: BudgetTotals;
  growth: GrowthPoint[];
  assumptions: BudgetAssumptions;
}
