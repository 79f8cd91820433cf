import type { RopeScalingBlock } from "../../../shared/schemas/analysis";
import { METHOD_CATALOG, YARN_DEFAULTS, yarnMscale } from "../../../shared/methods";
import type { MethodFn } from "../types";
import { modelFrequencies } from "../memo";
import { factorMismatchNote, patchWithScaling, resolveFactor } from "./common";

/** Defaults and g(s, m) (Peng et al. 2023, Eq. 22) live in the catalog so the forms show the same numbers. */
export { YARN_DEFAULTS, yarnMscale };

/**
 * Attention factor: explicit wins; else both mscale and mscaleAllDim (non-zero, as loaders test them) give
 * g(s, mscale)/g(s, mscaleAllDim); else g(s, 1).
 */
export function yarnAttentionFactor(
  s: number,
  p: { attentionFactor?: number; mscale?: number; mscaleAllDim?: number },
) {
  if (p.attentionFactor !== undefined) return p.attentionFactor;
  if (p.mscale && p.mscaleAllDim) return yarnMscale(s, p.mscale) / yarnMscale(s, p.mscaleAllDim);
  return yarnMscale(s);
}

/** Pair index that makes ρ rotations in the trained window: c(ρ) = d·ln(L/(2πρ)) / (2·ln b). */
export const correctionIndex = (rotations: number, d: number, base: number, trained: number) =>
  (d * Math.log(trained / (2 * Math.PI * rotations))) / (2 * Math.log(base));

/** The ramp bounds [low, high] of the implementation form, clamped to [0, d−1]. */
export function yarnRampRange(
  d: number,
  base: number,
  trained: number,
  betaFast: number,
  betaSlow: number,
  truncate: boolean,
) {
  let low = correctionIndex(betaFast, d, base, trained);
  let high = correctionIndex(betaSlow, d, base, trained);
  if (truncate) {
    low = Math.floor(low);
    high = Math.ceil(high);
  }
  low = Math.max(low, 0);
  high = Math.min(high, d - 1);
  if (low === high) high += 0.001; // the implementations' guard against a zero-width ramp
  return { low, high };
}

/**
 * YaRN (Peng et al. 2023, Eqs. 17-22) as implementations run it: the ramp is linear in the pair index j
 * (linear in ln r), not in r as the paper writes it, because that is what an exported configuration will execute.
 */
export const yarnMethod: MethodFn<"yarn"> = (ctx, params) => {
  const factor = resolveFactor(ctx, params.factor);
  const betaFast = params.betaFast ?? YARN_DEFAULTS.betaFast;
  const betaSlow = params.betaSlow ?? YARN_DEFAULTS.betaSlow;
  const truncate = params.truncate ?? YARN_DEFAULTS.truncate;
  const { low, high } = yarnRampRange(ctx.d, ctx.base, ctx.trainedContext, betaFast, betaSlow, truncate);
  const invFreq = modelFrequencies(ctx.d, ctx.base).map((theta, j) => {
    const ramp = Math.min(Math.max((j - low) / (high - low), 0), 1);
    const keep = 1 - ramp;
    return (theta / factor) * (1 - keep) + theta * keep;
  });
  const attentionFactor = yarnAttentionFactor(factor, params);

  const block: Omit<RopeScalingBlock, "original_max_position_embeddings"> = {
    rope_type: METHOD_CATALOG.yarn.exportType,
    factor,
    beta_fast: betaFast,
    beta_slow: betaSlow,
  };
  if (!truncate) block.truncate = false;
  if (params.attentionFactor !== undefined) block.attention_factor = params.attentionFactor;
  if (params.mscale !== undefined) block.mscale = params.mscale;
  if (params.mscaleAllDim !== undefined) block.mscale_all_dim = params.mscaleAllDim;

  const notes = factorMismatchNote(ctx, factor);
  if (params.attentionFactor === undefined && !!params.mscale !== !!params.mscaleAllDim) {
    notes.push(
      "mscale and mscale_all_dim only count together: with one of them missing or 0 the attention factor is g(s, 1)",
    );
  }
  return {
    invFreq,
    attentionFactor,
    params: {
      method: "yarn",
      factor,
      betaFast,
      betaSlow,
      truncate,
      attentionFactor,
      mscale: params.mscale,
      mscaleAllDim: params.mscaleAllDim,
    },
    ropeScaling: patchWithScaling(ctx, block),
    effectiveBase: null,
    notes,
  };
};
