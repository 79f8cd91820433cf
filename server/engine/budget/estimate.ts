import { describeAssumptions, resolveOptions, type ResolvedOptions } from "./assumptions";
import { acceleratorCost, acceleratorHours, attentionFlopsPerToken, flopsPerToken, wallClockHours } from "./flops";
import { growthCurve } from "./growth";
import {
  kvCacheBytesPerSequence,
  kvCacheBytesPerToken,
  minSequenceSharding,
  servingSequencesPerAccelerator,
  trainingMemoryPerAccelerator,
  weightBytes,
} from "./memory";
import { cumulativeTokens, stageTokens } from "../../../shared/stage-tokens";
import type { BudgetEstimate, BudgetTotals, ResolvedBudgetInput, StageEstimate, StageInput } from "./types";

const GIB = 2 ** 30;
const gib = (bytes: number) => `${(bytes / GIB).toFixed(1)} GiB`;

/** Cost, time and memory of a multi-stage context-extension run. Pure: no I/O, no clock, no randomness. */
export function estimateBudget(input: ResolvedBudgetInput): BudgetEstimate {
  if (input.stages.length === 0) throw new RangeError("a budget needs at least one stage");
  const options = resolveOptions(input);
  const model = { ...input.model, bytesPerElement: options.bytesPerElement, hiddenSize: options.hiddenSize };
  const perStage = input.stages.map((stage, index) => estimateStage({ ...input, model }, options, stage, index));
  const running = cumulativeTokens(perStage.map((s) => s.tokens));
  const stages = perStage.map((stage, k) => ({ ...stage, cumulativeTokens: running[k] }));
  return {
    stages,
    totals: sumTotals(stages),
    growth: growthCurve({
      model,
      cluster: input.cluster,
      utilization: options.utilization,
      convention: options.convention,
      recomputeFraction: options.recomputeFraction,
      trainedContext: options.trainedContext,
      targetContext: options.targetContext,
      points: options.growthPoints,
    }),
    assumptions: describeAssumptions(options),
  };
}

function estimateStage(
  input: ResolvedBudgetInput,
  options: ResolvedOptions,
  stage: StageInput,
  index: number,
): StageEstimate {
  const { model, cluster, accelerators } = input;
  const { sequenceLength } = stage;
  const { steps, tokenTarget, tokens } = stageTokens(stage);
  const { convention, recomputeFraction } = options;
  const perToken = flopsPerToken(model, sequenceLength, { convention, recomputeFraction });
  const flops = perToken * tokens;
  const hours = acceleratorHours(flops, cluster.peakFlops, options.utilization);
  const memoryInput = {
    model,
    sequenceLength,
    accelerators,
    microBatchSequences: options.microBatchSequences,
    optimizerBytesPerParameter: options.optimizerBytesPerParameter,
  };
  const memory = trainingMemoryPerAccelerator({ ...memoryInput, sequenceSharding: options.sequenceSharding });
  const fits = memory.total <= cluster.memoryBytes;
  const smallestFit = minSequenceSharding(memoryInput, cluster.memoryBytes);
  const serving = servingSequencesPerAccelerator(model, sequenceLength, cluster.memoryBytes);

  const warnings: string[] = [];
  if (!fits) {
    const remedy =
      smallestFit === null
        ? `no power-of-two sequence sharding up to ${accelerators} accelerators fits`
        : `sequence sharding of ${smallestFit} fits`;
    warnings.push(
      `training needs ${gib(memory.total)} per accelerator at sequence sharding ${options.sequenceSharding}, ` +
        `has ${gib(cluster.memoryBytes)}; ${remedy}`,
    );
  }
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
    kvCacheBytesPerToken: kvCacheBytesPerToken(model),
    kvCacheBytesPerSequence: kvCacheBytesPerSequence(model, sequenceLength),
    servingSequencesPerAccelerator: serving,
    trainingMemoryPerAccelerator: memory.total,
    trainingMemory: memory,
    fits,
    minSequenceSharding: smallestFit,
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
