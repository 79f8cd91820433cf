import { BUDGET_DEFAULTS } from "./defaults";
import type { ModelShape, TrainingMemory } from "./types";

type KvShape = Pick<ModelShape, "layers" | "kvHeads" | "headDim" | "bytesPerElement">;

const bytesOf = (model: { bytesPerElement?: number }) => model.bytesPerElement ?? BUDGET_DEFAULTS.bytesPerElement;
export const hiddenSizeOf = (model: Pick<ModelShape, "attentionHeads" | "headDim" | "hiddenSize">) =>
  model.hiddenSize ?? model.attentionHeads * model.headDim;

/** KV cache per token: a key and a value (the 2) per layer per KV head of headDim elements. */
export function kvCacheBytesPerToken(model: KvShape): number {
  return 2 * model.layers * model.kvHeads * model.headDim * bytesOf(model);
}

export function kvCacheBytesPerSequence(model: KvShape, sequenceLength: number): number {
  return kvCacheBytesPerToken(model) * sequenceLength;
}

export function weightBytes(model: Pick<ModelShape, "parameters" | "bytesPerElement">): number {
  return model.parameters * bytesOf(model);
}

/**
 * Whole sequences of KV cache that fit beside one full copy of the weights on one accelerator;
 * 0 when the weights alone do not fit. Ignores serving activations and fragmentation.
 */
export function servingSequencesPerAccelerator(
  model: KvShape & Pick<ModelShape, "parameters">,
  sequenceLength: number,
  memoryBytes: number,
): number {
  const free = memoryBytes - weightBytes(model);
  if (free <= 0) return 0;
  return Math.floor(free / kvCacheBytesPerSequence(model, sequenceLength));
}

export interface TrainingMemoryInput {
  model: ModelShape;
  sequenceLength: number;
  accelerators: number;
  sequenceSharding?: number;
  microBatchSequences?: number;
  optimizerBytesPerParameter?: number;
}

/** Data-parallel ranks: whole groups of `sequenceSharding` accelerators (a remainder sits idle). */
export function dataParallelRanks(accelerators: number, sequenceSharding: number): number {
  return Math.max(1, Math.floor(accelerators / sequenceSharding));
}

/**
 * Training memory per accelerator under a simple stated model (common practice, no source):
 * model states = parameters × optimizerBytesPerParameter, sharded over the data-parallel ranks;
 * activations with full recomputation = one checkpoint of each layer's input,
 * layers × (microBatchSequences × sequenceLength) × hiddenSize × bytes, split over the sequence-sharding degree.
 * Not counted: the working set of the layer being recomputed, logits, buffers, fragmentation.
 */
export function trainingMemoryPerAccelerator(input: TrainingMemoryInput): TrainingMemory {
  const sharding = input.sequenceSharding ?? BUDGET_DEFAULTS.sequenceSharding;
  const micro = input.microBatchSequences ?? BUDGET_DEFAULTS.microBatchSequences;
  const optimizerBytes = input.optimizerBytesPerParameter ?? BUDGET_DEFAULTS.optimizerBytesPerParameter;
  const { model } = input;
  const modelStates = (model.parameters * optimizerBytes) / dataParallelRanks(input.accelerators, sharding);
  const tokensPerMicroBatch = micro * input.sequenceLength;
  const activations = (model.layers * tokensPerMicroBatch * hiddenSizeOf(model) * bytesOf(model)) / sharding;
  return { modelStates, activations, total: modelStates + activations };
}

/** Powers of two from 1 up to and including the largest one ≤ accelerators. */
export function shardingDegrees(accelerators: number): number[] {
  const degrees: number[] = [];
  for (let degree = 1; degree <= accelerators; degree *= 2) degrees.push(degree);
  return degrees;
}

/** Smallest power-of-two sequence-sharding degree ≤ accelerators whose training memory fits, else null. */
export function minSequenceSharding(
  input: Omit<TrainingMemoryInput, "sequenceSharding">,
  memoryBytes: number,
): number | null {
  for (const degree of shardingDegrees(input.accelerators)) {
    if (trainingMemoryPerAccelerator({ ...input, sequenceSharding: degree }).total <= memoryBytes) return degree;
  }
  return null;
}
