import { BUDGET_DEFAULTS } from "./defaults";
import type { FlopConvention, ModelShape } from "./types";

type AttentionShape = Pick<ModelShape, "layers" | "attentionHeads" | "headDim">;

/**
 * Training FLOPs per token from the weights: 6N (Kaplan et al. 2020, Eq. 2.2 and Table 1: forward 2N,
 * training ≈ 3 × forward). Kaplan counts non-embedding parameters; we use the count given.
 */
export function parameterFlopsPerToken(parameters: number): number {
  return 6 * parameters;
}

/**
 * Training FLOPs per token spent in attention scores and weighted sums at context `sequenceLength`.
 * causal: 6·n_layer·n_ctx·d_attn, d_attn = heads × headDim (Kaplan et al. 2020, Eq. 2.2 / Table 1).
 * full:  12·n_layer·n_heads·head_dim·n_ctx (Chowdhery et al. 2022, PaLM, App. B; counts the masked half too).
 */
export function attentionFlopsPerToken(
  model: AttentionShape,
  sequenceLength: number,
  convention: FlopConvention,
): number {
  const perLayer = model.attentionHeads * model.headDim * sequenceLength;
  const multiplier = convention === "causal" ? 6 : 12;
  return multiplier * model.layers * perLayer;
}

/**
 * Recomputation re-runs `recomputeFraction` of the forward pass during backward; the forward pass is
 * one third of the training figure (the same 2N-of-6N split as above), so the factor is 1 + r/3.
 */
export function recomputeMultiplier(recomputeFraction: number): number {
  return 1 + recomputeFraction / 3;
}

export interface FlopOptions {
  convention?: FlopConvention;
  recomputeFraction?: number;
}

/** Training FLOPs per token: (6N + attention term) × recomputation factor. */
export function flopsPerToken(
  model: Pick<ModelShape, "parameters"> & AttentionShape,
  sequenceLength: number,
  { convention = BUDGET_DEFAULTS.convention, recomputeFraction = BUDGET_DEFAULTS.recomputeFraction }: FlopOptions = {},
): number {
  const base = parameterFlopsPerToken(model.parameters) + attentionFlopsPerToken(model, sequenceLength, convention);
  return base * recomputeMultiplier(recomputeFraction);
}

/** Accelerator-hours = FLOPs / (peak FLOP/s × utilisation × 3600 s). */
export function acceleratorHours(flops: number, peakFlops: number, utilization: number): number {
  return flops / (peakFlops * utilization * 3600);
}

/** Wall-clock hours when the work is spread evenly over `accelerators`. */
export function wallClockHours(hours: number, accelerators: number): number {
  return hours / accelerators;
}

/** Cost = accelerator-hours × price per accelerator-hour. */
export function acceleratorCost(hours: number, pricePerHour: number): number {
  return hours * pricePerHour;
}
