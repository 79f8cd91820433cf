import type { MethodFn } from "../types";
import { modelFrequencies } from "../memo";
import { patchWithBase } from "./common";

/** Plain RoPE (Su et al. 2021): θ_i = b^(−2i/d), a = 1; past the trained length this simply extrapolates. */
export const defaultMethod: MethodFn<"default"> = (ctx) => ({
  invFreq: modelFrequencies(ctx.d, ctx.base),
  attentionFactor: 1,
  params: { method: "default" },
  ropeScaling: patchWithBase(ctx, null),
  effectiveBase: ctx.base,
  notes: [],
});
