import { BUDGET_DEFAULTS } from "./defaults";
import type { ActivationCheckpointing, FlopConvention, ModelShape } from "./types";

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
 * Recompute FLOPs per token added by activation checkpointing; the forward pass is one third of a training figure
 * (the 2N-of-6N split above, applied to the attention term alike):
 * - none: nothing is re-run;
 * - selective: the attention core (scores, softmax, weighted sum) is re-run in backward (Korthikanti et al. 2022,
 *   Sec. 5), i.e. one forward pass of the attention term = attention ÷ 3;
 * - full: the whole forward pass is re-run = (6N + attention) ÷ 3, so training becomes 4/3 of the plain figure.
 */
export function checkpointingFlopsPerToken(
  model: Pick<ModelShape, "parameters"> & AttentionShape,
  sequenceLength: number,
  convention: FlopConvention,
  mode: ActivationCheckpointing,
): number {
  const attention = attentionFlopsPerToken(model, sequenceLength, convention);
  if (mode === "none") return 0;
  if (mode === "selective") return attention / 3;
  return (parameterFlopsPerToken(model.parameters) + attention) / 3;
}

export interface FlopOptions {
  convention?: FlopConvention;
  activationCheckpointing?: ActivationCheckpointing;
}

/** Training FLOPs per token: 6N + attention term + the recompute of the checkpointing mode. */
export function flopsPerToken(
  model: Pick<ModelShape, "parameters"> & AttentionShape,
  sequenceLength: number,
  {
    convention = BUDGET_DEFAULTS.convention,
    activationCheckpointing = BUDGET_DEFAULTS.activationCheckpointing,
  }: FlopOptions = {},
): number {
  const base = parameterFlopsPerToken(model.parameters) + attentionFlopsPerToken(model, sequenceLength, convention);
  return base + checkpointingFlopsPerToken(model, sequenceLength, convention, activationCheckpointing);
}

/**
 * Utilisation implied by a measured throughput: tokens/s per accelerator × FLOPs per token ÷ peak FLOP/s, with the
 * FLOPs per token of the measured length under the same settings, so hours at that length are tokens ÷ throughput.
 */
export function measuredUtilization(tokensPerSecond: number, perToken: number, peakFlops: number): number {
  return (tokensPerSecond * perToken) / peakFlops;
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
