import type { MethodFn } from "../types";
import { wavelength } from "../frequencies";
import { modelFrequencies } from "../memo";
import { patchWithScaling, resolveFactor } from "./common";
import { LLAMA3_DEFAULTS, METHOD_CATALOG } from "../../../shared/methods";

export { LLAMA3_DEFAULTS };

/**
 * Band-smoothed scaling published with the Llama 3.1 models (Meta, 2024). λ_low = L/lowFreqFactor,
 * λ_high = L/highFreqFactor: pairs with λ < λ_high keep θ, pairs with λ > λ_low get θ/f, and between
 * σ = (L/λ − low)/(high − low), θ' = (1−σ)·θ/f + σ·θ. a = 1.
 */
export const llama3Method: MethodFn<"llama3"> = (ctx, params) => {
  const factor = resolveFactor(ctx, params.factor);
  const lowFreqFactor = params.lowFreqFactor ?? LLAMA3_DEFAULTS.lowFreqFactor;
  const highFreqFactor = params.highFreqFactor ?? LLAMA3_DEFAULTS.highFreqFactor;
  const L = ctx.trainedContext;
  const lowWavelength = L / lowFreqFactor;
  const highWavelength = L / highFreqFactor;
  const invFreq = modelFrequencies(ctx.d, ctx.base).map((theta) => {
    const lambda = wavelength(theta);
    if (lambda < highWavelength) return theta;
    if (lambda > lowWavelength) return theta / factor;
    const sigma = (L / lambda - lowFreqFactor) / (highFreqFactor - lowFreqFactor);
    return ((1 - sigma) * theta) / factor + sigma * theta;
  });
  return {
    invFreq,
    attentionFactor: 1,
    params: { method: "llama3", factor, lowFreqFactor, highFreqFactor },
    ropeScaling: patchWithScaling(ctx, {
      rope_type: METHOD_CATALOG.llama3.exportType,
      factor,
      low_freq_factor: lowFreqFactor,
      high_freq_factor: highFreqFactor,
    }),
    effectiveBase: null,
    notes: [],
  };
};
