import { groupLayerCount, MAX_SEQUENCE_LENGTH } from "../../../shared/schemas/budget";
import { BUDGET_DEFAULTS } from "./defaults";
import type { LayerGroup, ModelShape } from "./types";

/*
 * Serving memory: KV cache and weights (a stated convention, docs/budget-conventions.md "KV cache"):
 * bytes per sequence = Σ over layer groups of elements per token per layer · bytes · layers · tokens held,
 * elements = 2 · kvHeads · headDim (a key and a value per KV head), or kvLatentDim for latent attention (one
 * compressed vector, no factor 2); tokens held = the sequence, capped at a local-window layer's window.
 */

export type KvShape = Pick<ModelShape, "layers" | "kvHeads" | "headDim" | "bytesPerElement"> &
  Partial<Pick<ModelShape, "layerGroups" | "kvLatentDim">>;

export const bytesOf = (model: { bytesPerElement?: number }) =>
  model.bytesPerElement ?? BUDGET_DEFAULTS.bytesPerElement;

/** Cached elements per token in one layer. */
export function kvElementsPerTokenPerLayer(model: KvShape): number {
  return model.kvLatentDim ? model.kvLatentDim : 2 * model.kvHeads * model.headDim;
}

/** The model's layer groups; a model without them is one group of full-attention layers. */
export function layerGroupsOf(model: KvShape): LayerGroup[] {
  return model.layerGroups ?? [{ kind: "full_attention", layers: model.layers, slidingWindow: null }];
}

/** Cache bytes per token while every layer still holds every token (below the smallest window). */
export function kvCacheBytesPerToken(model: KvShape, bytesPerElement = bytesOf(model)): number {
  return kvElementsPerTokenPerLayer(model) * model.layers * bytesPerElement;
}

/** Cache bytes of one sequence of `tokens`, each local-window group holding at most its window. */
export function kvCacheBytesPerSequence(model: KvShape, tokens: number, bytesPerElement = bytesOf(model)): number {
  const perLayerToken = kvElementsPerTokenPerLayer(model) * bytesPerElement;
  return layerGroupsOf(model).reduce(
    (sum, g) => sum + perLayerToken * groupLayerCount(g) * Math.min(tokens, g.slidingWindow ?? tokens),
    0,
  );
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
  kvBytesPerElement = bytesOf(model),
): number {
  const free = memoryBytes - weightBytes(model);
  if (free <= 0) return 0;
  return Math.floor(free / kvCacheBytesPerSequence(model, sequenceLength, kvBytesPerElement));
}

/**
 * The longest sequence one accelerator can serve: the largest length whose cache fits beside the weights,
 * found by bisection (the cache only grows with length), capped at the schema's longest sequence.
 * 0 when the weights alone do not fit.
 */
export function longestServableContext(
  model: KvShape & Pick<ModelShape, "parameters">,
  memoryBytes: number,
  kvBytesPerElement = bytesOf(model),
): number {
  const free = memoryBytes - weightBytes(model);
  const fits = (tokens: number) => kvCacheBytesPerSequence(model, tokens, kvBytesPerElement) <= free;
  if (free <= 0) return 0;
  if (fits(MAX_SEQUENCE_LENGTH)) return MAX_SEQUENCE_LENGTH;
  let low = 0; // fits
  let high = MAX_SEQUENCE_LENGTH; // does not fit
  while (high - low > 1) {
    const mid = Math.floor((low + high) / 2);
    if (fits(mid)) low = mid;
    else high = mid;
  }
  return low;
}
