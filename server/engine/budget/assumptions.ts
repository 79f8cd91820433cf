import { BUDGET_DEFAULTS, GROWTH_REACH } from "./defaults";
import { hiddenSizeOf } from "./memory";
import type { BudgetAssumptions, FlopConvention, ResolvedBudgetInput } from "./types";

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
  return {
    utilization: given("utilization", input.utilization, d.utilization),
    convention: given<FlopConvention>("convention", input.convention, d.convention),
    recomputeFraction: given("recomputeFraction", input.recomputeFraction, d.recomputeFraction),
    optimizerBytesPerParameter: given(
      "optimizerBytesPerParameter",
      input.optimizerBytesPerParameter,
      d.optimizerBytesPerParameter,
    ),
    sequenceSharding: given("sequenceSharding", input.sequenceSharding, d.sequenceSharding),
    microBatchSequences: given("microBatchSequences", input.microBatchSequences, d.microBatchSequences),
    growthPoints: given("growthPoints", input.growthPoints, d.growthPoints),
    trainedContext: given("trainedContext", input.trainedContext, Math.min(...lengths)),
    targetContext: given("targetContext", input.targetContext, Math.max(...lengths)),
    bytesPerElement: given("model.bytesPerElement", model.bytesPerElement, d.bytesPerElement),
    hiddenSize: given("model.hiddenSize", model.hiddenSize, hiddenSizeOf(model)),
    defaulted,
  };
}

export type ResolvedOptions = ReturnType<typeof resolveOptions>;

/** The assumptions block: every figure the estimate rests on, and where it comes from. */
export function describeAssumptions(options: ResolvedOptions): BudgetAssumptions {
  const convention = CONVENTIONS[options.convention];
  const utilizationGiven = !options.defaulted.includes("utilization");
  const optimizerGiven = !options.defaulted.includes("optimizerBytesPerParameter");
  return {
    convention: options.convention,
    conventionFormula: convention.formula,
    conventionSource: convention.source,
    utilization: options.utilization,
    utilizationSource: utilizationGiven
      ? "given with the request"
      : "assumed model FLOPs utilisation of 0.4: common practice, no source",
    recomputeFraction: options.recomputeFraction,
    optimizerBytesPerParameter: options.optimizerBytesPerParameter,
    optimizerBytesSource: optimizerGiven
      ? "given with the request"
      : "16 bytes per parameter: bf16 weights and gradients, fp32 master weights and Adam m, v — common practice, no source",
    bytesPerElement: options.bytesPerElement,
    hiddenSize: options.hiddenSize,
    sequenceSharding: options.sequenceSharding,
    microBatchSequences: options.microBatchSequences,
    trainedContext: options.trainedContext,
    targetContext: options.targetContext,
    defaulted: options.defaulted,
    memoryModel: [
      "Model states per accelerator = parameters × optimizerBytesPerParameter ÷ data-parallel ranks, " +
        "data-parallel ranks = floor(accelerators ÷ sequence sharding).",
      "Activations per accelerator, full recomputation: one checkpoint of each layer's input = " +
        "layers × microBatchSequences × sequenceLength × hiddenSize × bytesPerElement ÷ sequence sharding.",
      "Not counted: the recomputed layer's working set, logits, communication buffers, fragmentation.",
      "Serving: one whole copy of the weights per accelerator; the rest holds KV cache of whole sequences.",
    ],
    notes: [
      "N is the parameter count given; Kaplan et al. count non-embedding parameters, so a total count overstates 6N slightly.",
      `Recomputation adds recomputeFraction × forward FLOPs, forward = 1/3 of the training figure (factor 1 + r/3).`,
      "Accelerator-hours = FLOPs ÷ (peak FLOP/s × utilisation × 3600); wall-clock = accelerator-hours ÷ accelerators; cost = accelerator-hours × price per hour.",
      "A token target is met with whole steps: steps = ceil(tokens ÷ (globalBatch × sequenceLength)); FLOPs use the tokens of those steps.",
      `Growth curve: log-spaced lengths from the trained length to ${GROWTH_REACH} × the target, both ends included.`,
    ],
  };
}
