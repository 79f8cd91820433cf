import type { MethodFn } from "../types";
import { modelFrequencies } from "../memo";
import { METHOD_CATALOG } from "../../../shared/methods";
import { contextRatio, patchWithScaling } from "./common";

/** a = sqrt(1 + ln s / ln L) for s > 1, else 1 (Ding et al. 2024, LongRoPE). */
export const longropeAttentionFactor = (s: number, trained: number) =>
  s > 1 ? Math.sqrt(1 + Math.log(s) / Math.log(trained)) : 1;

/** Per-pair rescale factors: θ'_i = θ_i / e_i, e = long factors when L' > L, else short factors. */
export const longropeMethod: MethodFn<"longrope"> = (ctx, params) => {
  const s = contextRatio(ctx);
  const extended = ctx.targetContext > ctx.trainedContext;
  const e = extended ? params.longFactor : params.shortFactor;
  const invFreq = modelFrequencies(ctx.d, ctx.base).map((theta, i) => theta / e[i]);
  return {
    invFreq,
    attentionFactor: longropeAttentionFactor(s, ctx.trainedContext),
    params: { method: "longrope", longFactor: params.longFactor, shortFactor: params.shortFactor },
    ropeScaling: patchWithScaling(ctx, {
      rope_type: METHOD_CATALOG.longrope.exportType,
      factor: s,
      long_factor: params.longFactor,
      short_factor: params.shortFactor,
    }),
    effectiveBase: null,
    notes: [
      `using the ${extended ? "long" : "short"} factors for the whole target window`,
      "loaders switch between short and long factors by running length: keys cached before the switch were rotated with the other set",
    ],
  };
};
