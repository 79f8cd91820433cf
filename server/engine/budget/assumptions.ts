import { currentBudgetNames } from "../../../shared/budget-legacy-names";
import { BUDGET_CONVENTIONS } from "./conventions";
import { BUDGET_DEFAULTS } from "./defaults";
import { dataParallelRanks, hiddenSizeOf } from "./memory";
import type { ActivationCheckpointing, BudgetAssumptions, FlopConvention, ResolvedBudgetInput } from "./types";

const CONVENTIONS: Record<FlopConvention, { formula: string; source: string }> = {
  causal: {
    formula: "6N + 6·n_layer·n_ctx·d_attn, d_attn = n_heads·head_dim",
    source: "Kaplan et al. 2020, Eq. 2.2 and Table 1",
  },
  full: {
    formula: "6N + 12·n_layer·n_heads·head_dim·n_ctx",
    source: "Chowdhery et al. 2022 (PaLM), App. B",
  },
};

/** Every input with a default, resolved, plus the names of those that took their default. */
export function resolveOptions(input: ResolvedBudgetInput) {
  const lengths = input.stages.map((s) => s.sequenceLength);
  const defaulted: string[] = [];
  const given = <T>(name: string, value: T | undefined, fallback: T): T => {
    if (value !== undefined) return value;
    defaulted.push(name);
    return fallback;
  };
  const d = BUDGET_DEFAULTS;
  const { model } = input;
  // Budget model 1's names, still accepted.
  const current = currentBudgetNames(input);
  const bytesPerElement = given("model.bytesPerElement", model.bytesPerElement, d.bytesPerElement);
  const contextParallel = given("contextParallel", current.contextParallel, d.contextParallel);
  return {
    utilization: given("utilization", input.utilization, d.utilization),
    convention: given<FlopConvention>("convention", input.convention, d.convention),
    activationCheckpointing: given<ActivationCheckpointing>(
      "activationCheckpointing",
      current.activationCheckpointing,
      d.activationCheckpointing,
    ),
    flashAttention: given<boolean>("flashAttention", input.flashAttention, d.flashAttention),
    contextParallel,
    lossChunks: given("lossChunks", input.lossChunks, d.lossChunks),
    measuredTokensPerSecond: input.measuredTokensPerSecond ?? null,
    measuredSequenceLength:
      input.measuredTokensPerSecond === undefined ? null : (input.measuredSequenceLength ?? lengths[0]),
    optimizerBytesPerParameter: given(
      "optimizerBytesPerParameter",
      input.optimizerBytesPerParameter,
      d.optimizerBytesPerParameter,
    ),
    microBatchSequences: given("microBatchSequences", input.microBatchSequences, d.microBatchSequences),
    growthPoints: given("growthPoints", input.growthPoints, d.growthPoints),
    trainedContext: given("trainedContext", input.trainedContext, Math.min(...lengths)),
    targetContext: given("targetContext", input.targetContext, Math.max(...lengths)),
    bytesPerElement,
    kvCacheBytesPerElement: given("kvCacheBytesPerElement", input.kvCacheBytesPerElement, bytesPerElement),
    hiddenSize: given("model.hiddenSize", model.hiddenSize, hiddenSizeOf(model)),
    vocabSize: given<number | null>("model.vocabSize", model.vocabSize, null),
    dataParallelRanks: dataParallelRanks(input.accelerators, contextParallel),
    defaulted,
  };
}

export type ResolvedOptions = ReturnType<typeof resolveOptions>;

/** The assumptions block: every figure the estimate rests on, and where it comes from. */
export function describeAssumptions(options: ResolvedOptions, utilization: number): BudgetAssumptions {
  const convention = CONVENTIONS[options.convention];
  const optimizerGiven = !options.defaulted.includes("optimizerBytesPerParameter");
  const measured = options.measuredTokensPerSecond !== null;
  const utilizationSource = measured
    ? `derived from the measured ${options.measuredTokensPerSecond} tokens/s per accelerator at ${options.measuredSequenceLength} tokens`
    : options.defaulted.includes("utilization")
      ? "assumed model FLOPs utilisation of 0.4: common practice, no source"
      : "assumed: given with the request";
  const { defaulted, growthPoints: _points, measuredTokensPerSecond, measuredSequenceLength, ...settings } = options;
  return {
    ...settings,
    conventionFormula: convention.formula,
    conventionSource: convention.source,
    utilization,
    utilizationBasis: measured ? "measured" : "assumed",
    utilizationSource,
    measuredTokensPerSecond,
    measuredSequenceLength,
    optimizerBytesSource: optimizerGiven
      ? "given with the request"
      : "16 bytes per parameter: bf16 weights and gradients, fp32 master weights and Adam m, v — common practice, no source",
    defaulted: measured ? defaulted.filter((d) => d !== "utilization") : defaulted,
    conventions: [...BUDGET_CONVENTIONS],
  };
}
