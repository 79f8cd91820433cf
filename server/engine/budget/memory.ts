import { MEMORY_TERMS } from "../../../shared/schemas/budget";
import { BUDGET_DEFAULTS } from "./defaults";
import { bytesOf } from "./kv-cache";
import type { ActivationCheckpointing, MemoryTerm, ModelShape, TrainingMemory } from "./types";

export const hiddenSizeOf = (model: Pick<ModelShape, "attentionHeads" | "headDim" | "hiddenSize">) =>
  model.hiddenSize ?? model.attentionHeads * model.headDim;

export interface TrainingMemoryInput {
  model: ModelShape;
  sequenceLength: number;
  accelerators: number;
  activationCheckpointing?: ActivationCheckpointing;
  flashAttention?: boolean;
  contextParallel?: number;
  lossChunks?: number;
  microBatchSequences?: number;
  optimizerBytesPerParameter?: number;
}

/** Data-parallel ranks: whole groups of `contextParallel` accelerators (a remainder sits idle). */
export function dataParallelRanks(accelerators: number, contextParallel: number): number {
  return Math.max(1, Math.floor(accelerators / contextParallel));
}

/**
 * Activation bytes of one transformer layer, all kept, following Korthikanti et al. 2022, "Reducing Activation
 * Recomputation in Large Transformer Models", Table 2 (no tensor parallelism, t = 1): s·b·h·(34 + 5·a·s/h) at
 * 16-bit activations, i.e. 34·s·b·h + 5·a·s²·b; the 5·a·s²·b term is the attention scores, softmax and its
 * dropout mask, which a fused (flash) attention kernel never stores. Scaled by bytesPerElement ÷ 2 for other widths
 * (our convention).
 */
function layerActivationBytes(s: number, b: number, h: number, a: number, flash: boolean, scale: number): number {
  return scale * (34 * s * b * h + (flash ? 0 : 5 * a * s * s * b));
}

/**
 * Training memory per accelerator, in bytes. s = sequenceLength ÷ contextParallel (each rank holds its share of
 * every sequence), b = micro-batch sequences, h = hidden size, a = heads, l = layers, V = vocabulary.
 * - modelStates: parameters × optimizer bytes ÷ data-parallel ranks (common practice, no source).
 * - activationCheckpoints (Korthikanti et al. 2022, Table 2): none → l·(34sbh + 5as²b, the latter dropped with flash
 *   attention); selective (attention internals recomputed) → 34·s·b·h·l; full → 2·s·b·h·l, the layer inputs.
 * - recomputeWorkspace: full only, the one layer rebuilt at a time during backward: 34·s·b·h (+ 5·a·s²·b without
 *   flash attention).
 * - logits: s·b·V fp32 values (4 bytes) ÷ lossChunks, a stated convention; 0 when V is unknown.
 */
export function trainingMemoryPerAccelerator(input: TrainingMemoryInput): TrainingMemory {
  const d = BUDGET_DEFAULTS;
  const cp = input.contextParallel ?? d.contextParallel;
  const b = input.microBatchSequences ?? d.microBatchSequences;
  const mode = input.activationCheckpointing ?? d.activationCheckpointing;
  const flash = input.flashAttention ?? d.flashAttention;
  const chunks = input.lossChunks ?? d.lossChunks;
  const optimizerBytes = input.optimizerBytesPerParameter ?? d.optimizerBytesPerParameter;
  const { model } = input;
  const s = input.sequenceLength / cp;
  const h = hiddenSizeOf(model);
  const l = model.layers;
  const scale = bytesOf(model) / 2;
  const modelStates = (model.parameters * optimizerBytes) / dataParallelRanks(input.accelerators, cp);
  const fullLayer = layerActivationBytes(s, b, h, model.attentionHeads, flash, scale);
  const activationCheckpoints =
    mode === "none" ? l * fullLayer : mode === "selective" ? scale * 34 * s * b * h * l : scale * 2 * s * b * h * l;
  const recomputeWorkspace = mode === "full" ? fullLayer : 0;
  const logits = (s * b * (model.vocabSize ?? 0) * 4) / chunks;
  const total = modelStates + activationCheckpoints + recomputeWorkspace + logits;
  return { modelStates, activationCheckpoints, recomputeWorkspace, logits, total };
}

/** The term that takes the most memory (the first of equals, in the schema's order). */
export function largestMemoryTerm(memory: TrainingMemory): MemoryTerm {
  return MEMORY_TERMS.reduce<MemoryTerm>((best, t) => (memory[t] > memory[best] ? t : best), MEMORY_TERMS[0]);
}
