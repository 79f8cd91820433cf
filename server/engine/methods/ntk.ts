import type { MethodFn } from "../types";
import { inverseFrequencies } from "../frequencies";
import { patchWithBase, resolveFactor } from "./common";

/** b' = b · s^(d/(d−2)): the base change that divides the lowest-frequency pair by exactly s (Peng et al. 2023, §3.1, Eq. 16). */
export const ntkBase = (base: number, factor: number, d: number) => base * Math.pow(factor, d / (d - 2));

/** NTK-aware scaling: default RoPE on the changed base, a = 1. */
export const ntkMethod: MethodFn<"ntk"> = (ctx, params) => {
  const factor = resolveFactor(ctx, params.factor);
  const base = ntkBase(ctx.base, factor, ctx.d);
  return {
    invFreq: inverseFrequencies(ctx.d, base),
    attentionFactor: 1,
    params: { method: "ntk", factor },
    // The configuration convention has no static NTK-aware rope_type: the portable export is the new base.
    ropeScaling: patchWithBase(ctx, base),
    effectiveBase: base,
    notes: ["exported as a new rope_theta: the configuration convention has no static NTK-aware rope_type"],
  };
};
