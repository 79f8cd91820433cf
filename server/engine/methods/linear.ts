import type { MethodFn } from "../types";
import { modelFrequencies } from "../memo";
import { METHOD_CATALOG } from "../../../shared/methods";
import { patchWithScaling, resolveFactor } from "./common";

/** Position interpolation (Chen et al. 2023): every θ_i divided by s, a = 1. */
export const linearMethod: MethodFn<"linear"> = (ctx, params) => {
  const factor = resolveFactor(ctx, params.factor);
  return {
    invFreq: modelFrequencies(ctx.d, ctx.base).map((t) => t / factor),
    attentionFactor: 1,
    params: { method: "linear", factor },
    ropeScaling: patchWithScaling(ctx, { rope_type: METHOD_CATALOG.linear.exportType, factor }),
    effectiveBase: null,
    notes: [],
  };
};
