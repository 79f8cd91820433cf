import type { MethodFn } from "../types";
import { modelFrequencies } from "../memo";
import { patchWithBase } from "./common";

/** Adjusted base (Xiong et al. 2023: 10 000 → 500 000; Rozière et al. 2023: 1 000 000): default RoPE with a chosen base. */
export const baseMethod: MethodFn<"base"> = (ctx, params) => ({
  invFreq: modelFrequencies(ctx.d, params.base),
  attentionFactor: 1,
  params: { method: "base", base: params.base },
  ropeScaling: patchWithBase(ctx, params.base),
  effectiveBase: params.base,
  notes: [],
});
