import type { MethodFn } from "../types";
import { inverseFrequencies } from "../frequencies";
import { METHOD_CATALOG } from "../../../shared/methods";
import { dynamicBaseGrowth } from "../../../shared/methods/dynamic-factor";
import { patchWithScaling, resolveFactor } from "./common";

/**
 * Dynamic NTK-aware base at inference length l (Peng et al. 2023 §3.3, in the form the open model libraries run):
 * l_e = max(l, L), b' = b · (f·l_e/L − (f − 1))^(d/(d−2)).
 * Written as 1 + f·(l_e/L − 1), which is the same number algebraically and exactly 1 when l_e = L,
 * so at or below the trained length the result is bit-identical to default RoPE.
 */
export function dynamicBase(base: number, factor: number, d: number, length: number, trained: number) {
  return base * dynamicBaseGrowth(factor, d, length, trained);
}

export const dynamicMethod: MethodFn<"dynamic"> = (ctx, params) => {
  const factor = resolveFactor(ctx, params.factor);
  const sequenceLength = params.sequenceLength ?? ctx.targetContext;
  const base = dynamicBase(ctx.base, factor, ctx.d, sequenceLength, ctx.trainedContext);
  return {
    invFreq: inverseFrequencies(ctx.d, base),
    attentionFactor: 1,
    params: { method: "dynamic", factor, sequenceLength },
    // Loaders use max_position_embeddings as L in the formula above and only grow the base past it,
    // so the export keeps the trained length there; the base grows at inference time.
    ropeScaling: {
      ...patchWithScaling(ctx, { rope_type: METHOD_CATALOG.dynamic.exportType, factor }),
      max_position_embeddings: ctx.trainedContext,
    },
    effectiveBase: base,
    notes: [
      `frequencies shown at sequence length ${sequenceLength}; the base changes with the running length`,
      "max_position_embeddings stays at the trained length: loaders use it as L and only grow the base beyond it",
      "keys cached under a shorter length were rotated with an older base and no longer match the current one",
    ],
  };
};
