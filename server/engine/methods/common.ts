import type { ConfigPatch, RopeScalingBlock } from "../../../shared/schemas/analysis";
import type { MethodContext } from "../types";

/** s = L'/L, the default factor of every scaling method. */
export const contextRatio = (ctx: MethodContext) => ctx.targetContext / ctx.trainedContext;

export const resolveFactor = (ctx: MethodContext, factor: number | undefined) => factor ?? contextRatio(ctx);

export function patchWithScaling(
  ctx: MethodContext,
  block: Omit<RopeScalingBlock, "original_max_position_embeddings">,
): ConfigPatch {
  return {
    rope_scaling: { ...block, original_max_position_embeddings: ctx.trainedContext },
    max_position_embeddings: ctx.targetContext,
  };
}

export function patchWithBase(ctx: MethodContext, base: number | null): ConfigPatch {
  return base === null
    ? { rope_scaling: null, max_position_embeddings: ctx.targetContext }
    : { rope_scaling: null, rope_theta: base, max_position_embeddings: ctx.targetContext };
}

/**
 * A factor that differs from max_position_embeddings / original_max_position_embeddings leaves the two length keys
 * disagreeing with the factor; loaders that derive the factor (or the attention factor) from those keys run a
 * different scaling than the one analysed.
 */
export function factorMismatchNote(ctx: MethodContext, factor: number): string[] {
  const ratio = contextRatio(ctx);
  if (Math.abs(factor - ratio) <= 1e-12 * ratio) return [];
  return [
    `factor ${factor} differs from max_position_embeddings / original_max_position_embeddings = ${ratio}; ` +
      "tools that derive the factor from those two keys would run a different scaling",
  ];
}
