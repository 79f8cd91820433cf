import { describeAssumptions, resolveOptions, type ResolvedOptions } from "./assumptions";
import { cheapestFit } from "./fit";
import {
  acceleratorCost,
  acceleratorHours,
  attentionFlopsPerToken,
  flopsPerToken,
  measuredUtilization,
  wallClockHours,
} from "./flops";
import { growthCurve } from "./growth";
import {
  kvCacheBytesPerSequence,
  kvCacheBytesPerToken,
  longestServableContext,
  servingSequencesPerAccelerator,
  weightBytes,
} from "./kv-cache";
import { largestMemoryTerm, trainingMemoryPerAccelerator } from "./memory";
import { fitWarning } from "./warnings";
import { BUDGET_MODEL_VERSION } from "../../../shared/schemas/budget";
import { cumulativeTokens, stageTokens } from "../../../shared/stage-tokens";
import type { BudgetEstimate, BudgetTotals, ResolvedBudgetInput, StageEstimate, StageInput } from "./types";

const GIB = 2 ** 30;
const gib = (bytes: number) => `${(bytes / GIB).toFixed(1)} GiB`;

type Settings = ResolvedOptions & { utilization: number };

/** Cost, time and memory of a multi-stage context-extension run. Pure: no I/O, no clock, no randomness. */
export function estimateBudget(input: ResolvedBudgetInput): BudgetEstimate {
  if (input.stages.length === 0) throw new RangeError("a budget needs at least one stage");
  const options = resolveOptions(input);
  const model = {
    ...input.model,
    bytesPerElement: options.bytesPerElement,
    hiddenSize: options.hiddenSize,
    ...(options.vocabSize === null ? {} : { vocabSize: options.vocabSize }),
  };
  const settings: Settings = { ...options, utilization: utilizationOf(input, options, model) };
  const perStage = input.stages.map((stage, index) => estimateStage({ ...input, model }, settings, stage, index));
  const running = cumulativeTokens(perStage.map((s) => s.tokens));
  const stages = perStage.map((stage, k) => ({ ...stage, cumulativeTokens: running[k] }));
  return {
    budgetModel: BUDGET_MODEL_VERSION,
    stages,
    totals: sumTotals(stages),
    growth: growthCurve({
      model,
      cluster: input.cluster,
      utilization: settings.utilization,
      convention: options.convention,
      activationCheckpointing: options.activationCheckpointing,
      trainedContext: options.trainedContext,
      targetContext: options.targetContext,
      points: options.growthPoints,
    }),
    serving: {
      weightBytes: weightBytes(model),
      kvCacheBytesPerElement: options.kvCacheBytesPerElement,
      longestServableContext: longestServableContext(model, input.cluster.memoryBytes, options.kvCacheBytesPerElement),
    },
    assumptions: describeAssumptions(options, settings.utilization),
  };
}

/** The assumed utilisation, or the one a measured throughput implies (may exceed 1: the service refuses that). */
function utilizationOf(input: ResolvedBudgetInput, o: ResolvedOptions, model: ResolvedBudgetInput["model"]) {
  if (o.measuredTokensPerSecond === null || o.measuredSequenceLength === null) return o.utilization;
  const { convention, activationCheckpointing } = o;
  const perToken = flopsPerToken(model, o.measuredSequenceLength, { convention, activationCheckpointing });
  return measuredUtilization(o.measuredTokensPerSecond, perToken, input.cluster.peakFlops);
}

function estimateStage(input: ResolvedBudgetInput, o: Settings, stage: StageInput, index: number): StageEstimate {
  const { model, cluster, accelerators } = input;
  const { sequenceLength } = stage;
  const { steps, tokenTarget, tokens } = stageTokens(stage);
  const { convention, activationCheckpointing } = o;
  const perToken = flopsPerToken(model, sequenceLength, { convention, activationCheckpointing });
  const flops = perToken * tokens;
  const hours = acceleratorHours(flops, cluster.peakFlops, o.utilization);
  const memoryInput = {
    model,
    sequenceLength,
    accelerators,
    activationCheckpointing,
    flashAttention: o.flashAttention,
    contextParallel: o.contextParallel,
    lossChunks: o.lossChunks,
    microBatchSequences: o.microBatchSequences,
    optimizerBytesPerParameter: o.optimizerBytesPerParameter,
  };
  const memory = trainingMemoryPerAccelerator(memoryInput);
  const fits = memory.total <= cluster.memoryBytes;
  const largest = largestMemoryTerm(memory);
  const fitChange = fits ? null : cheapestFit(memoryInput, cluster.memoryBytes);
  const kvBytes = o.kvCacheBytesPerElement;
  const serving = servingSequencesPerAccelerator(model, sequenceLength, cluster.memoryBytes, kvBytes);

  const warnings: string[] = [];
  if (!fits) warnings.push(fitWarning(memory, largest, cluster.memoryBytes, memoryInput, fitChange));
  if (o.vocabSize === null) warnings.push("the vocabulary size is not given, so the logits are not counted");
  if (weightBytes(model) >= cluster.memoryBytes) {
    warnings.push(`the weights (${gib(weightBytes(model))}) do not fit on one accelerator for serving`);
  } else if (serving === 0) {
    warnings.push(`one sequence of KV cache at ${sequenceLength} tokens does not fit beside the weights for serving`);
  }

  return {
    index,
    sequenceLength,
    globalBatch: stage.globalBatch,
    steps,
    tokenTarget,
    tokens,
    cumulativeTokens: tokens, // replaced with the running total by estimateBudget
    flopsPerToken: perToken,
    attentionFlopsPerToken: attentionFlopsPerToken(model, sequenceLength, convention),
    flops,
    acceleratorHours: hours,
    wallClockHours: wallClockHours(hours, accelerators),
    cost: acceleratorCost(hours, cluster.pricePerHour),
    utilizationBasis: o.measuredTokensPerSecond === null ? "assumed" : "measured",
    kvCacheBytesPerToken: kvCacheBytesPerToken(model, kvBytes),
    kvCacheBytesPerSequence: kvCacheBytesPerSequence(model, sequenceLength, kvBytes),
    servingSequencesPerAccelerator: serving,
    trainingMemoryPerAccelerator: memory.total,
    trainingMemory: memory,
    fits,
    largestMemoryTerm: largest,
    fitChange,
    warnings,
  };
}

function sumTotals(stages: StageEstimate[]): BudgetTotals {
  const sum = (pick: (s: StageEstimate) => number) => stages.reduce((total, s) => total + pick(s), 0);
  return {
    tokens: sum((s) => s.tokens),
    flops: sum((s) => s.flops),
    acceleratorHours: sum((s) => s.acceleratorHours),
    wallClockHours: sum((s) => s.wallClockHours),
    cost: sum((s) => s.cost),
  };
}
