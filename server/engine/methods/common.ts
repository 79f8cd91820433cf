import type { ConfigPatch, RopeScalingBlock } from "../../../shared/schemas/analysis";
import type { MethodContext } from "../types";

/** s = L'/L, the default factor of every scaling method. */
export const contextRatio = (ctx: MethodContext) => ctx.targetContext / ctx.trainedContext;

export const resolveFactor = (ctx: MethodContext, factor: number | undefined) => factor ?? contextRatio(ctx);

/*
 * A model with multimodal sections reads them from the rotary block on every step (huggingface/transformers
 * src/transformers/models/qwen2_vl/modeling_qwen2_vl.py at 00b676f8, Qwen2VLAttention.forward passes
 * `self.rope_scaling["mrope_section"]`), so the patch of such a model keeps them in whatever block it writes: the
 * per-stack exports do the same (targets/hf/compile.ts, sectionKeysOf). `type` repeats `rope_type`: the 4.x
 * multimodal config classes copy `type` over `rope_type` (the reasons are at sectionKeyFields in
 * shared/schemas/analysis.ts).
 */
const sectionKeys = (ctx: Pick<MethodContext, "mropeSection" | "mropeInterleaved">) =>
  ctx.mropeSection?.length
    ? { mrope_section: [...ctx.mropeSection], ...(ctx.mropeInterleaved ? { mrope_interleaved: true } : {}) }
    : null;

export function patchWithScaling(
  ctx: MethodContext,
  block: Omit<RopeScalingBlock, "original_max_position_embeddings" | "type" | "mrope_section" | "mrope_interleaved">,
): ConfigPatch {
  const sections = sectionKeys(ctx);
  return {
    rope_scaling: {
      ...block,
      ...(sections ? { type: block.rope_type } : {}),
      original_max_position_embeddings: ctx.trainedContext,
      ...sections,
    },
    max_position_embeddings: ctx.targetContext,
  };
}

/**
 * Plain RoPE at a base: no block, or for a model with sections a `default` block holding only them. Also the block of
 * a layer group without rotary positions (plans/group-results.ts), which needs only the target and the sections.
 */
export function patchWithBase(
  ctx: Pick<MethodContext, "targetContext" | "mropeSection" | "mropeInterleaved">,
  base: number | null,
): ConfigPatch {
  const sections = sectionKeys(ctx);
  const rope_scaling = sections ? { rope_type: "default" as const, type: "default" as const, ...sections } : null;
  return base === null
    ? { rope_scaling, max_position_embeddings: ctx.targetContext }
    : { rope_scaling, rope_theta: base, max_position_embeddings: ctx.targetContext };
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
